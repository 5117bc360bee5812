// The reference for the Teams path: a bare botbuilder echo bot (CloudAdapter, authentication off),
// replying to each activity with its text through the connector named in its serviceUrl.
import { createServer } from "node:http";
import { CloudAdapter, ConfigurationBotFrameworkAuthentication } from "botbuilder";

const adapter = new CloudAdapter(new ConfigurationBotFrameworkAuthentication({}));
const server = createServer(async (req, res) => {
  if (req.url !== "/api/messages") return res.writeHead(404).end();
  const chunks = [];
  for await (const c of req) chunks.push(c);
  const body = JSON.parse(Buffer.concat(chunks).toString("utf8"));
  await adapter.process({ body, headers: req.headers, method: req.method }, shim(res), async (context) => {
    if (context.activity.type === "message") await context.sendActivity(`Echo: ${context.activity.text}`);
  });
});
function shim(res) {
  return {
    socket: res.socket,
    status(code) {
      res.statusCode = code;
      return this;
    },
    header(name, value) {
      res.setHeader(name, value);
      return this;
    },
    send(body) {
      res.end(body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body));
      return this;
    },
    end(...args) {
      if (!res.writableEnded) res.end(...args);
      return this;
    },
  };
}
server.listen(Number(process.env.PORT), "127.0.0.1", () => process.stderr.write('{"event":"ready"}\n'));
process.on("SIGTERM", () => server.close(() => process.exit(0)));
