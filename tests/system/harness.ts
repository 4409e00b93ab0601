import { spawn } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import mariadb from "mariadb";

// What scripts/stack.mjs hands the system phase: two app instances and a MariaDB the
// tests may stop and restart (its exact command line is in a JSON file).

export const URLS = (process.env.SLUICE_SYSTEM_URLS ?? "").split(",").filter(Boolean);
export const [A, B] = URLS;

export const DEMO_ADMIN = { email: "ada.admin@demo.invalid", password: "demo-admin-pass" };
export const DEMO_REVIEWER = { email: "rui.reviewer@demo.invalid", password: "demo-reviewer-pass" };

type DbCommand = { binary: string; args: string[]; port: number; pidFile: string };
const dbCommand = (): DbCommand => JSON.parse(fs.readFileSync(process.env.SLUICE_SYSTEM_DB!, "utf8"));

export function db() {
  const u = new URL(process.env.DATABASE_URL!);
  return mariadb.createConnection({
    host: u.hostname,
    port: Number(u.port),
    user: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    database: u.pathname.slice(1),
    bigIntAsNumber: true,
    insertIdAsNumber: true,
  });
}

const portAnswers = (port: number) =>
  new Promise<boolean>((resolve) => {
    const s = net.connect(port, "127.0.0.1");
    s.once("connect", () => (s.destroy(), resolve(true)));
    s.once("error", () => resolve(false));
  });

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Kills the database server (SIGKILL: a crash, not a clean shutdown) and waits until its port is closed. */
export async function killDatabase(): Promise<void> {
  const { pidFile, port } = dbCommand();
  const pid = Number(fs.readFileSync(pidFile, "utf8").trim());
  process.kill(pid, "SIGKILL");
  for (let i = 0; i < 100 && (await portAnswers(port)); i++) await sleep(100);
  for (let i = 0; i < 100; i++) {
    try {
      process.kill(pid, 0);
      await sleep(100);
    } catch {
      return;
    }
  }
}

/** Starts the database server again with the same command line; resolves once it answers. */
export async function startDatabase(): Promise<void> {
  const { binary, args, port } = dbCommand();
  const child = spawn(binary, args, { stdio: "ignore", detached: true });
  child.unref();
  for (let i = 0; i < 600; i++) {
    if (await portAnswers(port)) return;
    await sleep(100);
  }
  throw new Error("MariaDB did not come back within 60 s");
}

/** Signs in through next-auth's credentials flow over HTTP; returns the session cookie. */
export async function signIn(base: string, who: { email: string; password: string }, address = "192.0.2.10"): Promise<{ cookie: string | null; status: number; error?: string }> {
  const csrf = await fetch(`${base}/api/auth/csrf`, { headers: { "x-forwarded-for": address } });
  const { csrfToken } = await csrf.json();
  const csrfCookie = csrf.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: csrfCookie, origin: base, "x-forwarded-for": address },
    body: new URLSearchParams({ csrfToken, email: who.email, password: who.password, json: "true", callbackUrl: `${base}/` }),
  });
  const session = res.headers.getSetCookie().find((c) => c.startsWith("next-auth.session-token="));
  // With json=true next-auth answers {url}; otherwise it redirects. Either carries ?error=… on failure.
  const text = await res.text();
  let location = res.headers.get("location") ?? "";
  try {
    location ||= JSON.parse(text).url ?? "";
  } catch {}
  const error = /[?&]error=([^&]+)/.exec(location)?.[1];
  return { cookie: session ? session.split(";")[0] : null, status: res.status, error: error ? decodeURIComponent(error) : undefined };
}

/** A same-origin JSON request with a session cookie. */
export function api(base: string, cookie: string, method: string, path: string, body?: unknown) {
  return fetch(base + path, {
    method,
    headers: { cookie, origin: base, ...(body !== undefined ? { "content-type": "application/json" } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
}

export const pull = (base: string, token: string, headers: Record<string, string> = {}) =>
  fetch(`${base}/api/gateway/v1/bundle`, { headers: { authorization: `Bearer ${token}`, "accept-encoding": "identity", ...headers } });

/**
 * Publishes two releases in-process with the configured signing key: an empty
 * configuration, then the working one (so the working configuration stays equal to the
 * newest release and no change is left open). Urgent rollbacks alternating between the
 * two always have something to change. Returns their numbers.
 */
export async function twoReleases(slug: string): Promise<[number, number]> {
  const { publishRelease } = await import("@/lib/data/releases");
  const { loadWorkingConfig } = await import("@/lib/data/groups");
  const { Site, User, sequelize } = await import("@/models");
  const u = (await User.findOne({ where: { email: DEMO_ADMIN.email } }))!;
  const actor = { id: u.id, email: u.email, name: u.name, role: "admin" as const };
  const site = (await Site.findOne({ where: { slug } }))!;
  const working = await loadWorkingConfig(site.id);
  const empty = await sequelize.transaction((t) => publishRelease(site, { groups: [] } as never, { changeId: null, actor }, t));
  const full = await sequelize.transaction((t) => publishRelease(site, working, { changeId: null, actor }, t));
  return [empty.number, full.number];
}
