/** The terminal's rendering: the shared plain text, with the working shown when asked for. */
import type { Reply } from "../../bot/reply.js";
import { renderText } from "../../bot/text.js";

export function render(reply: Reply): string {
  return renderText(reply);
}
