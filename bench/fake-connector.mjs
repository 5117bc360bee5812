// A local stand-in for the Bot Framework connector (and Slack's auth.test), in its own process so
// it does not share the measured server's event loop. Answers every POST with a small JSON body.
import { createServer } from "node:http";

const server = createServer((req, res) => {
  req.resume();
  req.on("end", () => {
    const body = req.url?.includes("auth.test")
      ? { ok: true, user_id: "U0BENCHBOT", bot_id: "B0BENCH", team_id: "T0BENCH" }
      : { ok: true, id: "1" };
    res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(body));
  });
});
server.listen(Number(process.env.PORT), "127.0.0.1", () => process.stdout.write("ready\n"));
process.on("SIGTERM", () => server.close(() => process.exit(0)));
