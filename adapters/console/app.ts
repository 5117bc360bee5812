/**
 * The terminal chat: type messages as in a channel, get the same answers.
 *
 * A pasted block is one message: lines that arrive together (within `pasteMs` of each other) are
 * read as one, the way a results viewer's panel is pasted. Inside a paste, an empty line — or a
 * line that starts with a command word (check, plan, units …) — starts the next message; units,
 * help, handover and forget are one line each. A line
 * typed by hand and sent with Enter is a message of its own. "working" on its own shows the
 * working of the last answer; "quit" (or Ctrl-D) leaves.
 */
import { writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { createInterface } from "node:readline";
import type { Readable, Writable } from "node:stream";
import type { Conversation } from "../../bot/conversation.js";
import { errorCode } from "../../bot/log.js";
import type { Reply } from "../../bot/reply.js";
import { renderText } from "../../bot/text.js";
import { render } from "./render.js";

export const CONSOLE_CHANNEL = "terminal";
/** Lines closer together than this are one paste. */
export const PASTE_MS = 30;

const QUIT = /^(quit|exit|bye)$/i;
const WORKING = /^(working|more)$/i;
/** Commands whose whole message is their own line; others (check, plan, trend) take a pasted block. */
const ONE_LINE = /^(units?|help|\?|hello|hi|handover|handoff|forget)$/i;

/** Splits a burst of lines into messages: at empty lines, control words and command words. */
export function messagesOf(lines: string[], isCommand: (word: string) => boolean): string[] {
  const messages: string[] = [];
  let current: string[] = [];
  const flush = () => {
    if (current.length > 0) messages.push(current.join("\n"));
    current = [];
  };
  for (const raw of lines) {
    const line = raw.trim();
    const first = line.split(/\s+/)[0] ?? "";
    if (!line) flush();
    else if (QUIT.test(line) || WORKING.test(line) || ONE_LINE.test(first)) {
      flush();
      messages.push(line);
    } else {
      if (isCommand(first)) flush();
      current.push(line);
    }
  }
  flush();
  return messages;
}

/**
 * Writes each chart of a reply as a PNG into `dir` and says where, with its alt text. The file
 * is named by the case tag only (sodium-bed-12.png).
 */
export async function writeCharts(reply: Reply, dir: string, file?: string): Promise<string[]> {
  if (!reply.charts?.length) return [];
  const { drawChart } = await import("../../bot/charts.js");
  const lines: string[] = [];
  for (const [i, request] of reply.charts.entries()) {
    const chart = await drawChart(request);
    const path = file && i === 0 ? file : join(dir, chart.name);
    try {
      await writeFile(path, chart.png);
      lines.push(`Chart written to ${path}: ${chart.alt}`);
    } catch (error) {
      lines.push(`The chart could not be written to ${path} (${errorCode(error)}).`);
    }
  }
  return lines;
}

export async function startConsole(
  bot: Conversation,
  input: Readable,
  output: Writable,
  options: {
    pasteMs?: number /** Where charts are written; the system's temporary folder by default. */;
    chartDir?: string;
  } = {},
): Promise<void> {
  const rl = createInterface({ input, output, terminal: (output as { isTTY?: boolean }).isTTY === true });
  const write = (s: string) => output.write(`${s}\n`);
  write(
    "Solute — terminal chat. Type or paste lab values (e.g. Na 128 glu 540 mg/dL urea 14 mmol/L osm 310), help, or quit. A pasted report is read as one message.",
  );
  rl.setPrompt("solute> ");
  rl.prompt();
  let last: Reply | undefined;
  let closing = false;
  // Messages are answered one after another, in order.
  let queue = Promise.resolve();
  let burst: string[] = [];
  let timer: NodeJS.Timeout | undefined;
  const answer = (text: string) => {
    queue = queue.then(async () => {
      if (closing) return;
      if (QUIT.test(text)) {
        closing = true;
        rl.close();
        return;
      }
      if (WORKING.test(text)) {
        write(last ? renderText(last, { working: true }) : "No answer yet to show the working of.");
        write("");
        return;
      }
      last = await bot.handle({ text, channel: CONSOLE_CHANNEL, platform: "console" });
      write(render(last));
      for (const line of await writeCharts(last, options.chartDir ?? tmpdir())) write(line);
      write("");
    });
  };
  const flushBurst = () => {
    timer = undefined;
    const lines = burst;
    burst = [];
    const messages = messagesOf(lines, (w) => bot.isCommand(w));
    for (const m of messages) answer(m);
    queue = queue.then(() => {
      if (!closing) rl.prompt();
    });
  };
  const done = new Promise<void>((resolve) =>
    rl.on("close", () => {
      if (timer) {
        clearTimeout(timer);
        flushBurst();
      }
      void queue.then(resolve);
    }),
  );
  rl.on("line", (line) => {
    burst.push(line);
    if (timer) clearTimeout(timer);
    timer = setTimeout(flushBurst, options.pasteMs ?? PASTE_MS);
  });
  return done;
}
