/**
 * Sluice on the command line, for automation. `npm run -s cli -- …` (scripts/stack.mjs
 * finds the private MariaDB or starts it for the command) runs this with
 * `node --conditions=react-server --import tsx`; with DATABASE_URL set it can also run
 * directly. Writes are audited as "(cli)".
 *
 * Output for scripts: `gateway-token create` prints only the token on stdout, one line;
 * notes go to stderr. Exit codes: 0 done, 1 refused by the registry (unknown gateway,
 * already revoked, bad label…), 2 usage error.
 */
import { parseArgs } from "node:util";

const USAGE = [
  "usage: npm run -s cli -- gateway-token create --site <slug> --gateway <slug> [--label <text>] [--expires-days <days>]",
  "       npm run -s cli -- gateway-token list   --site <slug> --gateway <slug> [--json]",
  "       npm run -s cli -- gateway-token revoke --site <slug> --gateway <slug> --id <token id>",
].join("\n");

class UsageError extends Error {}

type Command =
  | { verb: "create"; site: string; gateway: string; label: string; expiresInDays: number | null }
  | { verb: "list"; site: string; gateway: string; json: boolean }
  | { verb: "revoke"; site: string; gateway: string; id: number };

/** Reads argv into one command, or throws UsageError naming what is wrong. */
function parseCommand(argv: string[]): Command {
  const [noun, verb, ...rest] = argv;
  if (noun !== "gateway-token") throw new UsageError(noun ? `unknown command "${noun}"` : "no command given");
  let parsed;
  try {
    parsed = parseArgs({
      args: rest,
      options: { site: { type: "string" }, gateway: { type: "string" }, label: { type: "string" }, "expires-days": { type: "string" }, id: { type: "string" }, json: { type: "boolean" } },
      strict: true,
      allowPositionals: false,
    });
  } catch (err) {
    throw new UsageError((err as Error).message);
  }
  const { site, gateway, label, id, json, "expires-days": expiresDays } = parsed.values;
  const allowed: Record<string, string[]> = { create: ["label", "expires-days"], list: ["json"], revoke: ["id"] };
  if (!verb || !(verb in allowed)) throw new UsageError(verb ? `unknown gateway-token command "${verb}"` : "gateway-token needs create, list or revoke");
  for (const [name, value] of Object.entries({ label, id, json, "expires-days": expiresDays })) {
    if (value !== undefined && !allowed[verb].includes(name)) throw new UsageError(`--${name} does not apply to gateway-token ${verb}`);
  }
  if (!site) throw new UsageError("--site <slug> is required");
  if (!gateway) throw new UsageError("--gateway <slug> is required");
  if (verb === "create") {
    // The range (1 … 3650) is checked with the console's rules and reported like theirs.
    if (expiresDays !== undefined && !/^[0-9]{1,9}$/.test(expiresDays)) throw new UsageError(`--expires-days must be a whole number of days, not "${expiresDays}"`);
    return { verb, site, gateway, label: label ?? "", expiresInDays: expiresDays === undefined ? null : Number(expiresDays) };
  }
  if (verb === "list") return { verb, site, gateway, json: json ?? false };
  if (id === undefined) throw new UsageError("--id <token id> is required");
  if (!/^[1-9][0-9]{0,9}$/.test(id)) throw new UsageError(`--id must be a token id (a positive whole number), not "${id}"`);
  return { verb: "revoke", site, gateway, id: Number(id) };
}

const note = (msg: string) => process.stderr.write(`sluice: ${msg}\n`);

async function run(cmd: Command): Promise<void> {
  // Loaded only for a well-formed command: usage errors need no database.
  const { CLI_ACTOR } = await import("@/lib/audit");
  const tokens = await import("@/lib/data/gateway-tokens");
  const where = `gateway ${cmd.gateway} at ${cmd.site}`;
  if (cmd.verb === "create") {
    const issued = await tokens.createGatewayToken(CLI_ACTOR, cmd.site, cmd.gateway, { label: cmd.label, expiresInDays: cmd.expiresInDays });
    process.stdout.write(`${issued.token}\n`);
    note(`issued token ${issued.prefix}… (id ${issued.id}${issued.label ? `, "${issued.label}"` : ""}) for ${where}${issued.expiresAt ? `, expiring ${stamp(issued.expiresAt)} UTC` : ", until revoked"}.`);
    note("It is shown only now: Sluice keeps only its SHA-256. The gateway's earlier tokens stay live until revoked.");
    return;
  }
  if (cmd.verb === "list") {
    const list = await tokens.listGatewayTokens(CLI_ACTOR, cmd.site, cmd.gateway);
    if (cmd.json) {
      process.stdout.write(`${JSON.stringify(list, null, 2)}\n`);
      return;
    }
    if (list.length === 0) {
      note(`${where} has no tokens.`);
      return;
    }
    const rows = [
      ["ID", "PREFIX", "STATE", "CREATED (UTC)", "BY", "EXPIRES (UTC)", "LAST USED", "LABEL"],
      ...list.map((t) => [String(t.id), `${t.prefix}…`, t.state, stamp(t.createdAt), t.createdBy, t.expiresAt ? stamp(t.expiresAt) : "never", t.lastUsedAt ? stamp(t.lastUsedAt) : "never", t.label]),
    ];
    const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
    for (const r of rows) process.stdout.write(`${r.map((c, i) => (i === r.length - 1 ? c : c.padEnd(widths[i]))).join("  ").trimEnd()}\n`);
    return;
  }
  const revoked = await tokens.revokeGatewayToken(CLI_ACTOR, cmd.site, cmd.gateway, cmd.id);
  process.stdout.write(`${revoked.id}\trevoked\t${revoked.prefix}…\t${revoked.revokedAt}\n`);
  note(`token ${revoked.prefix}… of ${where} is revoked; the gateway API refuses it from the next request.`);
}

const stamp = (iso: string) => `${iso.slice(0, 10)} ${iso.slice(11, 19)}`;

async function main(argv: string[]): Promise<number> {
  let cmd: Command;
  try {
    cmd = parseCommand(argv);
  } catch (err) {
    if (!(err instanceof UsageError)) throw err;
    process.stderr.write(`sluice: ${err.message}\n${USAGE}\n`);
    return 2;
  }
  const { describeError } = await import("@/lib/http");
  const { sequelize } = await import("@/models");
  const { ConnectionError } = await import("sequelize");
  try {
    await run(cmd);
    return 0;
  } catch (err) {
    if (err instanceof ConnectionError) {
      note(`failed: the database did not accept the connection (${err.message}); is DATABASE_URL or SLUICE_DB_PORT right?`);
      return 1;
    }
    const { status, body } = describeError(err);
    note(`${status >= 500 ? "failed" : "refused"} (${status}): ${body.error}`);
    return 1;
  } finally {
    await sequelize.close();
  }
}

main(process.argv.slice(2)).then(
  (code) => process.exit(code),
  (err) => {
    process.stderr.write(`sluice: ${(err as Error).message}\n`);
    process.exit(1);
  },
);
