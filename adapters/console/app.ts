/**
 * The terminal chat: type messages as in a channel, get the same answers. One line is one message.
 * "working" on its own shows the working of the last answer; "quit" (or Ctrl-D) leaves.
 */
import { createInterface } from "node:readline";
import type { Readable, Writable } from "node:stream";
import type { Conversation } from "../../bot/conversation.js";
import type { Reply } from "../../bot/reply.js";
import { renderText } from "../../bot/text.js";
import { render } from "./render.js";

export const CONSOLE_CHANNEL = "terminal";

export async function startConsole(bot: Conversation, input: Readable, output: Writable): Promise<void> {
  const rl = createInterface({ input, output, terminal: (output as { isTTY?: boolean }).isTTY === true });
  const write = (s: string) => output.write(`${s}\n`);
  write(
    "Solute — terminal chat. Type lab values (e.g. Na 128 glu 540 mg/dL urea 14 mmol/L osm 310), help, or quit.",
  );
  rl.setPrompt("solute> ");
  rl.prompt();
  let last: Reply | undefined;
  // Lines are answered one after another, in order, even when pasted all at once.
  let queue = Promise.resolve();
  const done = new Promise<void>((resolve) => rl.on("close", () => queue.then(resolve)));
  rl.on("line", (line) => {
    queue = queue.then(async () => {
      const text = line.trim();
      if (!text) return rl.prompt();
      if (/^(quit|exit|bye)$/i.test(text)) return rl.close();
      if (/^working$/i.test(text)) {
        write(last ? renderText(last, { working: true }) : "No answer yet to show the working of.");
        write("");
        return rl.prompt();
      }
      last = await bot.handle({ text, channel: CONSOLE_CHANNEL, platform: "console" });
      write(render(last));
      write("");
      rl.prompt();
    });
  });
  return done;
}
