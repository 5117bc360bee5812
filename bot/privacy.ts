/**
 * Channel keys are stored only as an HMAC of the platform and channel ID under a server secret, so
 * the store cannot be read back to a workspace's channels.
 */
import { createCipheriv, createDecipheriv, createHash, createHmac, randomBytes } from "node:crypto";

export type Platform = "console" | "slack" | "teams";

export function channelKey(secret: string, platform: Platform, channelId: string): string {
  return createHmac("sha256", secret)
    .update(`${platform}\u0000${channelId}`)
    .digest("base64url")
    .slice(0, 32);
}

/**
 * A reply kept for its buttons is encrypted at rest (AES-256-GCM, a key derived from the server
 * secret): the store holds ciphertext only, readable by no one without SOLUTE_SECRET.
 */
function replyKey(secret: string): Buffer {
  return createHash("sha256").update(`solute reply key\u0000${secret}`).digest();
}

export function sealReply(secret: string, plain: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", replyKey(secret), iv);
  const body = Buffer.concat([cipher.update(plain, "utf8"), cipher.final()]);
  return Buffer.concat([iv, cipher.getAuthTag(), body]).toString("base64url");
}

/** The reply, or undefined when it was not sealed with this secret (or was altered). */
export function openReply(secret: string, sealed: string): string | undefined {
  try {
    const raw = Buffer.from(sealed, "base64url");
    const decipher = createDecipheriv("aes-256-gcm", replyKey(secret), raw.subarray(0, 12));
    decipher.setAuthTag(raw.subarray(12, 28));
    return Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString("utf8");
  } catch {
    return undefined;
  }
}
