// Writes the Teams app package's manifest for this deployment into dist/teams-app/: the app ID
// (MicrosoftAppId) in id, bots[0].botId and the message action, and validDomains from
// SOLUTE_PUBLIC_HOST (the host of https://<host>/api/messages). Zip the folder's three files.
//   MicrosoftAppId=… SOLUTE_PUBLIC_HOST=solute.hospital.example npm run teams:manifest
import { copyFileSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";

const source = join(import.meta.dirname, "..", "adapters", "teams", "manifest");
const out = join(import.meta.dirname, "..", "dist", "teams-app");
const appId = process.env.MicrosoftAppId;
const host = process.env.SOLUTE_PUBLIC_HOST;
const problems = [];
if (!appId || !/^[0-9a-f-]{36}$/i.test(appId)) problems.push("MicrosoftAppId: the bot's app ID (a GUID)");
if (!host || !/^[a-z0-9.-]+$/i.test(host))
  problems.push("SOLUTE_PUBLIC_HOST: the host name Teams reaches, like solute.hospital.example");
if (problems.length > 0) {
  process.stderr.write(`Cannot write the Teams manifest; set:\n  ${problems.join("\n  ")}\n`);
  process.exit(1);
}
const manifest = JSON.parse(readFileSync(join(source, "manifest.json"), "utf8"));
manifest.id = appId;
manifest.bots[0].botId = appId;
for (const c of manifest.composeExtensions ?? []) c.botId = appId;
manifest.validDomains = [host];
for (const key of ["websiteUrl", "privacyUrl", "termsOfUseUrl"])
  manifest.developer[key] = manifest.developer[key].replace("solute.example.org", host);
mkdirSync(out, { recursive: true });
writeFileSync(join(out, "manifest.json"), `${JSON.stringify(manifest, null, 2)}\n`);
for (const icon of ["color.png", "outline.png"]) copyFileSync(join(source, icon), join(out, icon));
process.stdout.write(
  `Wrote ${join(out, "manifest.json")} (validDomains: ${host}); zip it with the two icons.\n`,
);
