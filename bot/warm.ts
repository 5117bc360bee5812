/**
 * A rehearsal before /readyz turns 200: a few invented messages run through the whole path —
 * reading, every rule, each command, and the platforms' renderers — on a throwaway memory store,
 * so the first person's answer meets code that is already compiled (a cold first answer took
 * about 40 times a warm one). Nothing is logged or kept.
 */
import type { BotConfig } from "./conversation.js";
import { Conversation } from "./conversation.js";
import type { Platform } from "./privacy.js";
import type { Reply } from "./reply.js";
import type { Store } from "./store.js";
import { renderText } from "./text.js";

/**
 * Invented messages of the kinds a first message is: a typed panel and a pasted report. The
 * commands are left out: each costs start-up time for a message that is rarely the first.
 */
const REHEARSAL = [
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
  "Sodium (135 - 145 mmol/L): 126 L\nGlucose 9.4 H mmol/L\nUrea\t14\tmmol/L\t2.5-7.8\tH\nOsmolality 262 mOsm/kg (275-295) L\nUrine:\nNa 71\nOsm 480",
];

export type Renderer = (reply: Reply, source: string) => unknown;

/** `store` is a throwaway (a new memory store), never the one that serves people. */
export async function rehearse(
  config: BotConfig,
  platform: Platform,
  renderers: Renderer[],
  store: Store,
): Promise<void> {
  const bot = new Conversation(store, config);
  for (const text of REHEARSAL) {
    const reply = await bot.handle({ text, channel: "rehearsal", platform, rehearsal: true });
    renderText(reply);
    for (const render of renderers) render(reply, text);
  }
}
