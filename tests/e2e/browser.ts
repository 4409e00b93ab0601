import fs from "node:fs";
import path from "node:path";
import { chromium, type Browser, type Page } from "playwright-core";

export const BASE_URL = process.env.SLUICE_E2E_URL ?? "http://127.0.0.1:3000";
const shotsDir = path.resolve("test-results", "screenshots");

export const DEMO = {
  admin: { email: "ada.admin@demo.invalid", password: "demo-admin-pass", name: "Ada Marsh" },
  reviewer: { email: "rui.reviewer@demo.invalid", password: "demo-reviewer-pass", name: "Rui Calder" },
  engineer: { email: "eli.engineer@demo.invalid", password: "demo-engineer-pass", name: "Eli Brennan" },
  viewer: { email: "vic.viewer@demo.invalid", password: "demo-viewer-pass", name: "Vic Holloway" },
} as const;

/**
 * Debian's Chromium, headless, with the flags this machine's closed network needs (and any
 * extra ones: the benchmarks pass V8 flags through it).
 */
export function launch(extraArgs: string[] = []): Promise<Browser> {
  return chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      "--no-first-run",
      ...extraArgs,
    ],
  });
}

export async function signIn(page: Page, who: { email: string; password: string }) {
  await page.goto(`${BASE_URL}/sign-in`);
  await page.getByLabel("E-mail").fill(who.email);
  await page.getByLabel("Password").fill(who.password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** Saves a screenshot for people to look at (test-results/screenshots); never used as proof. */
export async function screenshot(page: Page, name: string) {
  fs.mkdirSync(shotsDir, { recursive: true });
  await page.screenshot({ path: path.join(shotsDir, `${name}.png`), fullPage: true });
}

/** Signs in through next-auth's credentials endpoint over plain HTTP (no browser); returns the Cookie header of the session. */
export async function signInOverHttp(who: { email: string; password: string }): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const at = pair.indexOf("=");
      jar.set(pair.slice(0, at), pair.slice(at + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrfRes = await fetch(`${BASE_URL}/api/auth/csrf`);
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${BASE_URL}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email: who.email, password: who.password, json: "true" }),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.endsWith("next-auth.session-token"))) throw new Error(`signing in as ${who.email} gave no session (HTTP ${res.status})`);
  return cookie();
}
