import { parseArgs } from "node:util";
import type { AgentOptions } from "./agent";

export const USAGE = `usage: npm run agent -- --url <registry base url> --token-file <file> --state-dir <dir>
       --input <data.csv> --output <reduced.csv> [--trust <keys.json>] [--watch]
       [--max-silence <seconds>] [--skew <seconds>]`;

export type CliOptions = Pick<AgentOptions, "url" | "tokenFile" | "stateDir" | "input" | "output" | "trust" | "watch" | "maxSilenceS" | "skewS">;

const seconds = (name: string, text: string | undefined, positive: boolean): number | undefined => {
  if (text === undefined) return undefined;
  const n = Number(text);
  if (text.trim() === "" || !Number.isFinite(n) || n < 0 || (positive && n === 0)) throw new Error(`--${name} needs a ${positive ? "positive" : "non-negative"} number of seconds, got "${text}"`);
  return n;
};

/** The agent's command line; throws with a message naming the problem (the caller prints {@link USAGE}). */
export function parseAgentArgs(argv: string[]): CliOptions {
  const { values } = parseArgs({
    args: argv,
    strict: true,
    allowPositionals: false,
    options: {
      url: { type: "string" },
      "token-file": { type: "string" },
      "state-dir": { type: "string" },
      input: { type: "string" },
      output: { type: "string" },
      trust: { type: "string" },
      watch: { type: "boolean", default: false },
      "max-silence": { type: "string" },
      skew: { type: "string" },
    },
  });
  const missing = ["url", "token-file", "state-dir", "input", "output"].filter((k) => !values[k as keyof typeof values]);
  if (missing.length > 0) throw new Error(`missing ${missing.map((k) => `--${k}`).join(", ")}`);
  const url = values.url!;
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    throw new Error(`--url "${url}" is not an absolute URL`);
  }
  if (parsed.protocol !== "https:" && parsed.protocol !== "http:") throw new Error(`--url must be http(s), got ${parsed.protocol}`);
  return {
    url,
    tokenFile: values["token-file"]!,
    stateDir: values["state-dir"]!,
    input: values.input!,
    output: values.output!,
    trust: values.trust,
    watch: values.watch ?? false,
    maxSilenceS: seconds("max-silence", values["max-silence"], true),
    skewS: seconds("skew", values.skew, false) ?? 60,
  };
}
