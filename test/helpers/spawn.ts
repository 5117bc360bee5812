/** Runs a real command of the project and collects its output. */
import { spawn } from "node:child_process";
import { join } from "node:path";

export const ROOT = join(import.meta.dirname, "..", "..");

/** The environment without platform credentials, so `npm start` opens the terminal chat. */
export function cleanEnv(extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [k, v] of Object.entries(process.env)) {
    if (!/^(SLACK_|Microsoft|TEAMS_|REDIS_URL|SOLUTE_)/.test(k)) env[k] = v;
  }
  return { ...env, ...extra };
}

export interface Ran {
  code: number | null;
  stdout: string;
  stderr: string;
}

export function run(
  command: string,
  args: string[],
  options: { input?: string; env?: NodeJS.ProcessEnv; timeoutMs?: number } = {},
): Promise<Ran> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, {
      cwd: ROOT,
      env: options.env ?? cleanEnv(),
      stdio: ["pipe", "pipe", "pipe"],
    });
    let stdout = "";
    let stderr = "";
    child.stdout.on("data", (d) => {
      stdout += d;
    });
    child.stderr.on("data", (d) => {
      stderr += d;
    });
    const timer = setTimeout(() => {
      child.kill("SIGKILL");
      reject(new Error(`timed out: ${command} ${args.join(" ")}\n${stdout}\n${stderr}`));
    }, options.timeoutMs ?? 60_000);
    child.on("error", reject);
    child.on("close", (code) => {
      clearTimeout(timer);
      resolve({ code, stdout, stderr });
    });
    if (options.input !== undefined) child.stdin.end(options.input);
    else child.stdin.end();
  });
}

/** The one-shot command, run as node runs it (the npm script adds only npm's own start-up). */
export function solute(args: string[], env?: NodeJS.ProcessEnv): Promise<Ran> {
  return run(process.execPath, ["--import", "tsx", "bot/cli.ts", ...args], env ? { env } : {});
}
