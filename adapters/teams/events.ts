/** Turns what Teams sends into the plain text the conversation reads, and finds the channel. */

export interface TeamsActivityLike {
  text?: string;
  conversation?: { id?: string; conversationType?: string };
  channelData?: { channel?: { id?: string }; teamsChannelId?: string };
  entities?: { type?: string; mentioned?: { id?: string }; text?: string }[];
  recipient?: { id?: string };
}

/** Removes <at>…</at> mentions and HTML entities that Teams puts in plain text. */
export function cleanText(text: string): string {
  return (
    text
      .replace(/<at>[^<]{0,200}<\/at>/gi, " ")
      // A pasted block arrives as paragraphs or line breaks: keep its lines.
      .replace(/<br\s{0,4}\/?>|<\/p>|<\/div>|<\/tr>/gi, "\n")
      .replace(/<\/t[dh]>/gi, "\t")
      .replace(/<[a-z/][^<>]{0,200}>/gi, "")
      .replace(/&nbsp;/g, " ")
      .replace(/&lt;/g, "<")
      .replace(/&gt;/g, ">")
      .replace(/&amp;/g, "&")
      .trim()
  );
}

/** Whether the bot itself is @mentioned in the activity. */
export function mentionsBot(activity: TeamsActivityLike): boolean {
  const me = activity.recipient?.id;
  return (activity.entities ?? []).some((e) => e.type === "mention" && e.mentioned?.id === me);
}

/**
 * The channel a message belongs to, for settings and the shift log: a Teams channel's ID (every
 * thread of it shares one log), else the conversation without its ";messageid=" part.
 */
export function channelOf(activity: TeamsActivityLike): string {
  const id =
    activity.channelData?.channel?.id ??
    activity.channelData?.teamsChannelId ??
    activity.conversation?.id ??
    "";
  return id.split(";")[0]!;
}
