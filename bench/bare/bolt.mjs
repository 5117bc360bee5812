// The reference for the Slack path: a bare Bolt app that acknowledges a slash command with a fixed
// text, on the same receiver and server setup as Solute (HTTPReceiver mounted on node:http).
// With ACK_BODY set (JSON), it acknowledges with that body instead: the cost of the answer's size
// alone, without computing it.
import { createServer } from "node:http";
import { App, HTTPReceiver, LogLevel } from "@slack/bolt";

const FIXED = process.env.ACK_BODY
  ? JSON.parse(process.env.ACK_BODY)
  : { response_type: "ephemeral", text: "Received." };
const receiver = new HTTPReceiver({
  signingSecret: process.env.SLACK_SIGNING_SECRET,
  endpoints: "/slack/events",
  logLevel: LogLevel.ERROR,
});
const app = new App({
  token: process.env.SLACK_BOT_TOKEN,
  receiver,
  logLevel: LogLevel.ERROR,
  clientOptions: { slackApiUrl: process.env.SLACK_API_URL },
});
app.command(process.env.SLACK_COMMAND ?? "/solute", async ({ ack }) => {
  await ack(FIXED);
});
const server = createServer((req, res) => {
  if (req.url === "/healthz") return res.writeHead(200).end("ok");
  receiver.requestListener(req, res);
});
server.listen(Number(process.env.PORT), "127.0.0.1", () => process.stderr.write('{"event":"ready"}\n'));
process.on("SIGTERM", () => server.close(() => process.exit(0)));
