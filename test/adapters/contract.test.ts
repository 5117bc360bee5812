/**
 * One contract for every chat adapter: the same requests through the terminal, Slack and Teams,
 * each rendering carrying the same facts, problems and cautions as the neutral reply.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { oneShot } from "../../adapters/console/oneshot.js";
import { createSlackAdapter, type SlackAdapter } from "../../adapters/slack/app.js";
import { render as renderSlack } from "../../adapters/slack/render.js";
import { MemoryStore } from "../../adapters/store/memory.js";
import { createTeamsAdapter } from "../../adapters/teams/app.js";
import { loadConfig } from "../../bot/config.js";
import { Conversation } from "../../bot/conversation.js";
import type { Reply } from "../../bot/reply.js";
import { type HttpServer, startServer } from "../../bot/server.js";
import { cautionsOf, typeset } from "../../bot/text.js";
import { fixture } from "../helpers/fixtures.js";
import { type FakeSlack, fakeSlack, form, postSigned } from "../helpers/slack.js";
import { type FakeConnector, fakeConnector, replay } from "../helpers/teams.js";

const SIGNING = "contract-signing-secret";
const env = {
  SOLUTE_SECRET: "solute-secret-0123456789",
  SLACK_BOT_TOKEN: "xoxb-test",
  SLACK_SIGNING_SECRET: SIGNING,
  TEAMS_LOCAL: "1",
};

const REQUESTS = [
  "Na 128 glu 540 mg/dL urea 14 mmol/L osm 310",
  "Na 139 glu 6.1 mmol/L urea 5.2 mmol/L osm 318 EtOH 230 mg/dL Cl 101 HCO3 12",
  "glucose 30 Na 1280",
  "check Na 128 glu 540 mg/dL urea 14 mmol/L calc osm 810",
  "Mr Ashdown-Pryce Na 128 glu 6 mmol/L urea 4 mmol/L",
  "plan Na 110 TBW 30 L 1 L 3% NaCl",
  "help",
  // A pasted report: ranges before and after results, flags, a urine section, a lab-calculated field.
  "Sodium (135 - 145 mmol/L): 126 L\nGlucose 9.4 H mmol/L\nUrea\t14\tmmol/L\t2.5-7.8\tH\nOsmolality 262 mOsm/kg (275-295) L\nOsmolality, calculated 281\nUrine:\nNa 71\nOsm 480",
];

let api: FakeSlack;
let connector: FakeConnector;
let server: HttpServer;
let slack: SlackAdapter;

beforeAll(async () => {
  api = await fakeSlack();
  connector = await fakeConnector();
  const config = loadConfig({ ...env, SLACK_API_URL: `${api.url}/api/` });
  const bot = new Conversation(new MemoryStore(), config);
  slack = createSlackAdapter({ config: config.slack!, bot });
  await slack.start();
  const teams = createTeamsAdapter({ config: config.teams!, bot });
  server = await startServer({
    port: 0,
    host: "127.0.0.1",
    routes: { "/slack/events": slack.handler!, "/api/messages": teams.handler },
    store: bot.store,
  });
});

afterAll(async () => {
  await server.close();
  await slack.stop();
  await api.close();
  await connector.close();
});

/** The neutral reply, for what every rendering must carry. */
async function neutral(text: string): Promise<Reply> {
  const config = loadConfig({ SOLUTE_SECRET: "solute-secret-0123456789" });
  return new Conversation(new MemoryStore(), config).handle({ text, channel: "x", platform: "console" });
}

async function viaTerminal(text: string, working = false): Promise<string> {
  let out = "";
  await oneShot(
    working ? ["--working", text] : [text],
    (s) => {
      out += s;
    },
    () => {},
    () => new MemoryStore(),
  );
  return out;
}

/** What a person sees in Slack's blocks: their texts, unescaped. */
const slackText = (blocks: unknown) =>
  JSON.stringify(blocks)
    .replace(/&lt;/g, "<")
    .replace(/&gt;/g, ">")
    .replace(/&amp;/g, "&")
    .replace(/∗/g, "*");

async function viaSlack(text: string, n: number): Promise<string> {
  const base = fixture("slash-commands-slack.json").slashCommandWithArgs;
  const res = await postSigned(
    `http://127.0.0.1:${server.port}/slack/events`,
    SIGNING,
    form({ ...base, command: "/solute", text, response_url: `${api.url}/respond/${n}` }),
    "application/x-www-form-urlencoded",
  );
  return slackText((JSON.parse(res.text) as { blocks: unknown }).blocks);
}

/** What a person sees in Teams: the card's texts with their Markdown escapes removed. */
const teamsText = (card: unknown) => JSON.stringify(card).replace(/\\\\(.)/g, "$1");

async function viaTeams(text: string): Promise<{ body: string; all: string }> {
  const before = connector.sent.length;
  await fetch(`http://127.0.0.1:${server.port}/api/messages`, {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify(replay(fixture("dm-teams.json").dmMessage, text, connector.serviceUrl)),
  });
  const sent = await connector.waitFor(before + 1);
  const card = (sent[before]!.activity.attachments as { content: { body: unknown; actions?: unknown } }[])[0]!
    .content;
  return { body: teamsText(card.body), all: teamsText({ body: card.body, actions: card.actions }) };
}

const json = (s: string) => JSON.stringify(s).slice(1, -1);
const has = (rendered: string, piece: string) =>
  rendered.includes(piece) ||
  rendered.includes(json(piece)) ||
  rendered.includes(typeset(piece)) ||
  rendered.includes(json(typeset(piece)));

describe.each(REQUESTS.map((r, i) => [r, i] as const))("contract: %s", (text, i) => {
  it("the first view on the terminal, Slack and Teams carries the verdict, numbers, problems and fitting cautions", async () => {
    const reply = await neutral(text);
    const first = {
      terminal: await viaTerminal(text),
      slack: await viaSlack(text, i),
      teams: (await viaTeams(text)).body,
    };
    const must = [
      reply.headline,
      reply.keyNumbers,
      ...reply.problems.map((p) => p.message),
      ...cautionsOf(reply),
    ].filter((x): x is string => Boolean(x));
    for (const [name, rendered] of Object.entries(first)) {
      for (const piece of must) expect(has(rendered, piece), `${name} lacks: ${piece}`).toBe(true);
      expect(rendered, name).not.toContain("Ashdown");
    }
  });

  it("behind the tap, every surface carries every fact, finding and caution", async () => {
    const reply = await neutral(text);
    const all = {
      terminal: await viaTerminal(text, true),
      slack: slackText(renderSlack(reply, { working: true }).blocks),
      teams: (await viaTeams(text)).all,
    };
    const must = [
      reply.headline,
      ...reply.facts.map((f) => f.value),
      ...reply.facts.map((f) => f.label),
      ...reply.problems.map((p) => p.message),
      ...reply.cautions,
      ...reply.interpretation,
    ];
    expect(must.length).toBeGreaterThan(1);
    for (const [name, rendered] of Object.entries(all)) {
      for (const piece of must) expect(has(rendered, piece), `${name} lacks: ${piece}`).toBe(true);
    }
  });
});

describe("a pasted report on every surface", () => {
  it("reads the serum and urine values by specimen and checks the lab's calculated field", async () => {
    const text = REQUESTS.at(-1)!;
    const reply = await neutral(text);
    expect(reply.data!.reading!.inputs).toMatchObject({ sodium: 126, urea: 14, measuredOsmolality: 262 });
    expect(reply.data!.reading!.inputs.urineSodium).toBe(71);
    expect(reply.data!.reading!.inputs.urineOsmolality).toBe(480);
    expect(reply.readAs).toMatch(/urine Na 71 mmol\/L/);
    expect(reply.notes.join()).toMatch(/As printed: The calculated osmolality 281/);
    for (const rendered of [await viaTerminal(text), await viaSlack(text, 99), (await viaTeams(text)).body]) {
      expect(rendered).toContain("urine Na 71");
    }
  });
});
