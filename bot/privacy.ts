/**
 * Channel keys are stored only as an HMAC of the platform and channel ID under a server secret, so
 * the store cannot be read back to a workspace's channels.
 */
import { createHmac } from "node:crypto";

export type Platform = "console" | "slack" | "teams";

export function channelKey(secret: string, platform: Platform, channelId: string): string {
  return createHmac("sha256", secret)
    .update(`${platform}\u0000${channelId}`)
    .digest("base64url")
    .slice(0, 32);
}
