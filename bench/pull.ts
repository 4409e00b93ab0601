/**
 * `npm run bench:pull`: the gateway pull path under load (autocannon on loopback, 50
 * connections) against the production build, with a constant route of the same build as
 * the ceiling, all measured in one run. Prints requests per second, latency percentiles,
 * errors, the 304 path's share of the ceiling, and the database statements per request
 * (MariaDB's `Questions` counter before and after each run).
 *
 * Targets (issue #10): 304 path ≥ 50 % of the constant route's requests per second, one
 * indexed query per request, zero errors, p99 ≤ 50 ms.
 */
import autocannon, { type Result } from "autocannon";
import mariadb, { type Connection } from "mariadb";
import { generateToken } from "../lib/gateway/token";

const BASE = process.env.SLUICE_E2E_URL ?? "http://127.0.0.1:3000";
const DURATION = Number(process.env.BENCH_SECONDS ?? 10);
const CONNECTIONS = 50;

function dbConfig() {
  const u = new URL(process.env.DATABASE_URL!);
  return { host: u.hostname, port: Number(u.port), user: decodeURIComponent(u.username), password: decodeURIComponent(u.password), database: u.pathname.slice(1), bigIntAsNumber: true };
}

async function questions(conn: Connection): Promise<number> {
  const rows = await conn.query("SHOW GLOBAL STATUS LIKE 'Questions'");
  return Number(rows[0].Value);
}

function run(title: string, path: string, headers: Record<string, string>): Promise<Result> {
  return new Promise((resolve, reject) => {
    const instance = autocannon({ url: BASE + path, connections: CONNECTIONS, duration: DURATION, headers, title }, (err, result) => (err ? reject(err) : resolve(result)));
    void instance;
  });
}

type Row = { name: string; rps: number; p50: number; p99: number; errors: number; statuses: string; queries: number | null };

async function measure(conn: Connection, name: string, path: string, headers: Record<string, string>): Promise<Row> {
  const q0 = await questions(conn);
  const r = await run(name, path, headers);
  const q1 = await questions(conn);
  const total = r.requests.total;
  const statuses = Object.entries(r.statusCodeStats ?? {})
    .map(([code, s]) => `${code}×${(s as { count: number }).count}`)
    .join(" ");
  // Two statements of our own (the SHOW before and after) are not the app's.
  return { name, rps: r.requests.average, p50: r.latency.p50, p99: r.latency.p99, errors: r.errors + r.timeouts, statuses, queries: total > 0 ? (q1 - q0 - 1) / total : null };
}

async function main() {
  const conn = await mariadb.createConnection(dbConfig());
  const [gw] = await conn.query("SELECT g.id, g.slug FROM gateways g WHERE g.current_bundle_id IS NOT NULL ORDER BY g.id LIMIT 1");
  if (!gw) throw new Error("no gateway has a released bundle: seed the demo first");
  const t = generateToken();
  await conn.query("INSERT INTO gateway_tokens (gateway_id, token_hash, prefix, label, created_at) VALUES (?, ?, ?, 'bench', NOW(3))", [gw.id, t.hash, t.prefix]);
  const auth = { authorization: `Bearer ${t.token}` };
  const first = await fetch(`${BASE}/api/gateway/v1/bundle`, { headers: { ...auth, "accept-encoding": "identity" } });
  if (first.status !== 200) throw new Error(`the first pull answered ${first.status}`);
  const etag = first.headers.get("etag")!;
  const size = (await first.arrayBuffer()).byteLength;

  // Warm up every path (JIT, connection pool, bundle cache) before measuring.
  for (const p of ["/api/gateway/v1/openapi.json", "/api/gateway/v1/bundle"]) await fetch(BASE + p, { headers: auth }).then((r) => r.arrayBuffer());
  const warm = Number(process.env.BENCH_WARMUP_SECONDS ?? 3);
  await new Promise<void>((resolve, reject) => autocannon({ url: `${BASE}/api/gateway/v1/bundle`, connections: CONNECTIONS, duration: warm, headers: { ...auth, "if-none-match": etag } }, (e) => (e ? reject(e) : resolve())));

  const rows: Row[] = [];
  rows.push(await measure(conn, "constant route (ceiling)", "/api/gateway/v1/openapi.json", {}));
  rows.push(await measure(conn, "pull, 304 (If-None-Match)", "/api/gateway/v1/bundle", { ...auth, "if-none-match": etag }));
  rows.push(await measure(conn, `pull, 200 (${size} B bundle)`, "/api/gateway/v1/bundle", { ...auth, "accept-encoding": "identity" }));
  await conn.query("DELETE FROM gateway_tokens WHERE token_hash = ?", [t.hash]);
  await conn.end();

  const pad = (s: string, n: number) => s.padEnd(n);
  console.log(`\ngateway pull benchmark: autocannon, ${CONNECTIONS} connections, ${DURATION} s each, loopback, production build`);
  console.log(`${pad("path", 30)} ${pad("req/s", 9)} ${pad("p50 ms", 7)} ${pad("p99 ms", 7)} ${pad("errors", 7)} ${pad("queries/req", 12)} statuses`);
  for (const r of rows) {
    console.log(`${pad(r.name, 30)} ${pad(r.rps.toFixed(0), 9)} ${pad(String(r.p50), 7)} ${pad(String(r.p99), 7)} ${pad(String(r.errors), 7)} ${pad(r.queries === null ? "-" : r.queries.toFixed(2), 12)} ${r.statuses}`);
  }
  const [ceiling, notModified] = rows;
  const share = notModified.rps / ceiling.rps;
  const okStatuses = /^304×\d+$/.test(notModified.statuses);
  console.log(`\n304 path: ${(share * 100).toFixed(0)} % of the constant route (target ≥ 50 %); p99 ${notModified.p99} ms (target ≤ 50); errors ${notModified.errors} (target 0); ${notModified.queries?.toFixed(2)} queries per request (target 1)`);
  const met = share >= 0.5 && notModified.p99 <= 50 && notModified.errors === 0 && okStatuses && (notModified.queries ?? 9) <= 1.05;
  console.log(met ? "targets met" : "targets NOT met");
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
