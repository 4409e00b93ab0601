/**
 * The reference gateway agent (lib/agent/README.md):
 * npm run agent -- --url … --token-file … --state-dir … --input … --output … [--watch]
 */
import { EXIT, runAgent } from "@/lib/agent/agent";
import { USAGE, parseAgentArgs } from "@/lib/agent/cli";

const log = (line: string) => process.stderr.write(`${new Date().toISOString()} sluice-agent: ${line}\n`);

async function main(): Promise<number> {
  let cli;
  try {
    cli = parseAgentArgs(process.argv.slice(2));
  } catch (e) {
    process.stderr.write(`sluice-agent: ${(e as Error).message}\n${USAGE}\n`);
    return EXIT.fatal;
  }
  const stop = new AbortController();
  for (const signal of ["SIGINT", "SIGTERM"] as const) process.once(signal, () => stop.abort());
  return runAgent({ ...cli, log, signal: stop.signal });
}

main().then(
  (code) => process.exit(code),
  (e) => {
    log(`stopped: ${(e as Error).stack ?? String(e)}`);
    process.exit(EXIT.fatal);
  },
);
