/** Turns what Slack sends into the plain text the conversation reads. */

/** Removes user and channel mentions, unwraps links to their label, unescapes &amp; &lt; &gt;. */
export function cleanText(text: string): string {
  return text
    .replace(/<@[A-Z0-9]+(\|[^>]*)?>/g, " ")
    .replace(/<#[A-Z0-9]+(\|[^>]*)?>/g, " ")
    .replace(/<!(here|channel|everyone)[^>]*>/g, " ")
    .replace(/<([^<>|]{1,2000})\|([^<>]{0,2000})>/g, "$1 $2")
    .replace(/<([^<>]{1,2000})>/g, "$1")
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&amp;/g, "&")
    .trim();
}

/** A slash command's text may start with the bot's own command word ("/solute help"): it does not. */
export function slashText(text: string | undefined): string {
  return cleanText(text ?? "");
}
