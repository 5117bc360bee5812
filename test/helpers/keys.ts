/**
 * A local stand-in for the Bot Framework's published signing keys: an OpenID metadata document
 * and a JSON Web Key Set on 127.0.0.1, and RS256 tokens signed with node:crypto, so Teams
 * authentication is tested in both directions without the network.
 */
import { createSign, generateKeyPairSync, type KeyObject } from "node:crypto";
import { createServer } from "node:http";
import type { AddressInfo, Socket } from "node:net";

export interface KeySet {
  metadataUrl: string;
  /** "error": the metadata answers 503; "closed": connections are dropped; undefined: serving. */
  outage?: "error" | "closed";
  sign(claims: Record<string, unknown>): string;
  signWithOtherKey(claims: Record<string, unknown>): string;
  close(): Promise<void>;
}

const KID = "solute-test-key";
const base64url = (data: string | Buffer) => Buffer.from(data).toString("base64url");

function signJwt(key: KeyObject, claims: Record<string, unknown>): string {
  const head = `${base64url(JSON.stringify({ alg: "RS256", typ: "JWT", kid: KID }))}.${base64url(JSON.stringify(claims))}`;
  return `${head}.${createSign("RSA-SHA256").update(head).sign(key).toString("base64url")}`;
}

export async function localKeySet(): Promise<KeySet> {
  const published = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const other = generateKeyPairSync("rsa", { modulusLength: 2048 });
  const jwk = published.publicKey.export({ format: "jwk" });
  const sockets = new Set<Socket>();
  const state: { outage?: "error" | "closed" } = {};
  const server = createServer((req, res) => {
    if (state.outage === "closed") {
      req.socket.destroy();
      return;
    }
    if (state.outage === "error") {
      res.writeHead(503).end();
      return;
    }
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    res.writeHead(200, { "content-type": "application/json" });
    if (req.url === "/keys")
      res.end(JSON.stringify({ keys: [{ ...jwk, kid: KID, use: "sig", endorsements: ["msteams"] }] }));
    else res.end(JSON.stringify({ issuer: "https://api.botframework.com", jwks_uri: `${base}/keys` }));
  });
  server.on("connection", (s) => {
    sockets.add(s);
    s.once("close", () => sockets.delete(s));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
  const port = (server.address() as AddressInfo).port;
  return {
    // A path of its own per key set: botframework-connector caches keys by metadata URL.
    metadataUrl: `http://127.0.0.1:${port}/openidconfiguration`,
    get outage() {
      return state.outage;
    },
    set outage(v) {
      state.outage = v;
    },
    sign: (claims) => signJwt(published.privateKey, claims),
    signWithOtherKey: (claims) => signJwt(other.privateKey, claims),
    close: async () => {
      for (const s of sockets) s.destroy();
      await new Promise<void>((r) => server.close(() => r()));
    },
  };
}
