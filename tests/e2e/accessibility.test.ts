import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import type { APIRequestContext, Browser, BrowserContext, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, signIn } from "./browser";

// axe-core on every console page, one test per page, as a user who may see it, on the
// demo data. Fails on any violation of impact "serious" or "critical", naming the rules
// and the elements. axe is evaluated through the DevTools protocol (page.evaluate with its
// source), not added as a <script>: the pages' nonce CSP would refuse an unstamped script,
// and this way the page is checked under the same CSP people get.

const axeSource = fs.readFileSync(createRequire(import.meta.url).resolve("axe-core/axe.min.js"), "utf8");

type Role = keyof typeof DEMO;
type Ids = { profile: number; group: number; change: number; reviewSite: string; reviewChange: number };
type Case = { name: string; role: Role | null; path: (ids: Ids) => string; ready?: (page: Page) => Promise<void> };

const SITE = "fenwick-creamery";
const SITE_WITH_DRAFT = "osterby-cheese";

const CASES: Case[] = [
  { name: "sign-in", role: null, path: () => "/sign-in" },
  { name: "overview", role: "viewer", path: () => "/" },
  { name: "not found", role: "viewer", path: () => "/no-such-page" },
  { name: "sites", role: "viewer", path: () => "/sites" },
  { name: "new site", role: "admin", path: () => "/sites/new" },
  { name: "fleet", role: "viewer", path: () => "/fleet" },
  { name: "site", role: "viewer", path: () => `/sites/${SITE}` },
  { name: "site settings", role: "admin", path: () => `/sites/${SITE}/settings` },
  { name: "gateway (with tokens panel)", role: "admin", path: () => `/sites/${SITE}/gateways/fw-gw-01` },
  { name: "tags", role: "engineer", path: () => `/sites/${SITE}/tags`, ready: (p) => p.getByRole("table").first().waitFor() },
  { name: "tag import", role: "engineer", path: () => `/sites/${SITE}/tags/import` },
  { name: "groups", role: "engineer", path: () => `/sites/${SITE}/groups` },
  { name: "new group", role: "engineer", path: () => `/sites/${SITE}/groups/new` },
  { name: "group", role: "engineer", path: (ids) => `/sites/${SITE}/groups/${ids.group}` },
  { name: "group assignment", role: "engineer", path: (ids) => `/sites/${SITE}/groups/${ids.group}/assignment` },
  { name: "assignments", role: "viewer", path: () => `/sites/${SITE}/assignments` },
  { name: "coverage", role: "viewer", path: () => `/sites/${SITE}/coverage` },
  { name: "draft", role: "engineer", path: () => `/sites/${SITE_WITH_DRAFT}/draft` },
  { name: "change (draft)", role: "reviewer", path: (ids) => `/sites/${SITE_WITH_DRAFT}/changes/${ids.change}` },
  { name: "change in review (diffs and impact)", role: "reviewer", path: (ids) => `/sites/${ids.reviewSite}/changes/${ids.reviewChange}` },
  { name: "releases", role: "reviewer", path: () => `/sites/${SITE}/releases` },
  { name: "release compare", role: "reviewer", path: () => `/sites/${SITE}/releases/compare?from=1&to=1` },
  { name: "site estimates", role: "viewer", path: () => `/sites/${SITE}/estimates` },
  { name: "profiles", role: "viewer", path: () => "/profiles" },
  { name: "new profile", role: "engineer", path: () => "/profiles/new" },
  { name: "profile import", role: "engineer", path: () => "/profiles/import" },
  { name: "profile", role: "viewer", path: (ids) => `/profiles/${ids.profile}` },
  { name: "profile edit", role: "engineer", path: (ids) => `/profiles/${ids.profile}/edit` },
  { name: "profile compare", role: "viewer", path: (ids) => `/profiles/${ids.profile}/compare` },
  { name: "workbench", role: "engineer", path: () => "/workbench" },
  { name: "workbench with a preview", role: "engineer", path: () => "/workbench", ready: previewSomething },
  { name: "estimates", role: "viewer", path: () => "/estimates" },
  { name: "audit log", role: "viewer", path: () => "/audit" },
  { name: "users", role: "admin", path: () => "/admin/users" },
  { name: "mail", role: "admin", path: () => "/admin/mail" },
];

/** Runs a preview on a small CSV, so the metrics, the chart and its summary are on the page. */
async function previewSomething(page: Page) {
  await page.getByLabel("Profile", { exact: true }).selectOption({ label: "Temperature shape (analog)" });
  await page.getByLabel(/^Deviation \(degC\)/).waitFor();
  const start = Date.UTC(2026, 2, 2, 6);
  const rows = Array.from({ length: 900 }, (_, i) => `${new Date(start + i * 1000).toISOString()},${(60 + Math.sin(i / 40) * 8).toFixed(3)},${i === 450 ? "bad" : "good"}`);
  await page.getByLabel("Sample data CSV").setInputFiles({ name: "a11y.csv", mimeType: "text/csv", buffer: Buffer.from(["timestamp,value,quality", ...rows].join("\n") + "\n") });
  await page.getByTestId("metrics-shape").filter({ hasText: "900" }).waitFor({ timeout: 30_000 });
  await page.getByTestId("chart-summary").waitFor();
}

/**
 * A site of its own with a change submitted for review (a new group with an assignment),
 * so the review page shows its diffs, summary and impact without touching the demo plants
 * other browser tests work on.
 */
async function siteWithChangeInReview(api: APIRequestContext): Promise<{ site: string; change: number }> {
  const id = Date.now().toString(36);
  const site = `a11y-${id}`;
  const call = async <T>(method: "post" | "put", p: string, data: unknown): Promise<T> => {
    const res = await api[method](`${BASE_URL}${p}`, { data });
    if (!res.ok()) throw new Error(`${method.toUpperCase()} ${p}: ${res.status()} ${await res.text()}`);
    return (await res.json().catch(() => ({}))) as T;
  };
  await call("post", "/api/sites", { name: `Accessibility check ${id}`, slug: site, timeZone: "Europe/London", uplinkBudgetKbps: 64, storagePricePerGbMonth: 0.02, retentionMonths: 12, defaultHandling: "pass-through" });
  await call("post", `/api/sites/${site}/gateways`, { name: "Check gateway", slug: `${site}-gw`, description: "", pollSeconds: 60 });
  for (const n of [101, 102, 103]) {
    await call("post", `/api/sites/${site}/tags`, { name: `HALL/TT-${n}/PV`, unit: "degC", samplePeriodMs: 1000, kind: "analog", euLow: 0, euHigh: 150, area: "HALL", equipment: null, gateway: `${site}-gw` });
  }
  const group = await call<{ id: number }>("post", `/api/sites/${site}/groups`, {
    name: "hall-temperatures",
    description: "",
    regulated: false,
    selector: { patterns: ["HALL/*/PV"], units: [], kinds: [], areas: [], equipment: [], gateways: [], minPeriodMs: null, maxPeriodMs: null, include: [], exclude: [] },
  });
  const { profiles } = (await (await api.get(`${BASE_URL}/api/profiles`)).json()) as { profiles: { id: number; name: string }[] };
  await call("put", `/api/sites/${site}/groups/${group.id}/assignment`, { profileId: profiles.find((p) => p.name === "Temperature shape")!.id, revision: 2 });
  const { changeId } = await call<{ changeId: number }>("post", `/api/sites/${site}/changes`, { note: "Accessibility check" });
  return { site, change: changeId };
}

/** The route of each page file under app/, as the CASES above spell it (dynamic segments as [name]). */
function pageRoutes(dir = path.resolve("app"), prefix = ""): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    if (e.isDirectory() && e.name !== "api") {
      const seg = /^\(.*\)$/.test(e.name) ? "" : `/${e.name}`;
      out.push(...pageRoutes(path.join(dir, e.name), prefix + seg));
    } else if (e.name === "page.tsx") out.push(prefix || "/");
  }
  return out;
}

type Violation = { id: string; impact: string | null; help: string; nodes: { target: unknown[]; failureSummary?: string }[] };

async function seriousViolations(page: Page): Promise<Violation[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: Violation[] }> } }).axe;
    const r = await axe.run(document, { resultTypes: ["violations"] });
    return r.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, failureSummary: n.failureSummary })) }));
  });
  return violations.filter((v) => v.impact === "serious" || v.impact === "critical");
}

const describeViolations = (vs: Violation[]) =>
  vs
    .map((v) => `${v.id} (${v.impact}): ${v.help}\n${v.nodes.map((n) => `    ${JSON.stringify(n.target)} ${n.failureSummary?.split("\n").slice(1).join(" ") ?? ""}`).join("\n")}`)
    .join("\n");

describe("accessibility (axe-core): no serious or critical violation on any console page", () => {
  let browser: Browser;
  const contexts = new Map<Role | null, BrowserContext>();
  let ids: Ids;

  async function contextFor(role: Role | null): Promise<BrowserContext> {
    let context = contexts.get(role);
    if (!context) {
      context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
      if (role) {
        const page = await context.newPage();
        await signIn(page, DEMO[role]);
        await page.close();
      }
      contexts.set(role, context);
    }
    return context;
  }

  beforeAll(async () => {
    browser = await launch();
    const api = (await contextFor("viewer")).request;
    const get = async <T>(p: string): Promise<T> => {
      const res = await api.get(`${BASE_URL}${p}`);
      if (!res.ok()) throw new Error(`GET ${p}: ${res.status()}`);
      return (await res.json()) as T;
    };
    const { profiles } = await get<{ profiles: { id: number; name: string }[] }>("/api/profiles");
    const { groups } = await get<{ groups: { id: number; name: string }[] }>(`/api/sites/${SITE}/groups`);
    const { changes } = await get<{ changes: { id: number }[] }>(`/api/sites/${SITE_WITH_DRAFT}/changes`);
    const review = await siteWithChangeInReview((await contextFor("admin")).request);
    ids = {
      reviewSite: review.site,
      reviewChange: review.change,
      // Two revisions, so the compare page shows a diff.
      profile: profiles.find((p) => p.name === "Temperature shape")!.id,
      // A regulated-record group with an assignment.
      group: groups.find((g) => g.name === "pasteuriser-temperatures")!.id,
      change: changes[0].id,
    };
  });

  afterAll(async () => {
    // Best effort: a site whose change is in review may refuse deletion, and it harms no other test.
    if (ids?.reviewSite) await contexts.get("admin")?.request.delete(`${BASE_URL}/api/sites/${ids.reviewSite}`).catch(() => undefined);
    for (const c of contexts.values()) await c.close();
    await browser?.close();
  });

  it("has a case for every page in app/", () => {
    const covered = new Set(
      CASES.map((c) =>
        c.path({ profile: 1, group: 1, change: 1, reviewSite: "a11y", reviewChange: 1 })
          .split("?")[0]
          .replace(/^\/sites\/(?!new$)[^/]+/, "/sites/[site]")
          .replace(/\/gateways\/[^/]+/, "/gateways/[gateway]")
          .replace(/\/profiles\/\d+/, "/profiles/[profileId]")
          .replace(/\/groups\/\d+/, "/groups/[groupId]")
          .replace(/\/changes\/\d+/, "/changes/[changeId]"),
      ),
    );
    expect(pageRoutes().filter((r) => !covered.has(r))).toEqual([]);
  });

  for (const c of CASES) {
    it(`${c.name} (${c.role ?? "signed out"})`, async () => {
      const page = await (await contextFor(c.role)).newPage();
      try {
        const url = `${BASE_URL}${c.path(ids)}`;
        const res = await page.goto(url);
        expect(res?.status(), url).toBe(c.name === "not found" ? 404 : 200);
        expect(new URL(page.url()).pathname, "redirected").toBe(new URL(url).pathname);
        await page.waitForLoadState("networkidle");
        if (c.ready) await c.ready(page);
        const found = await seriousViolations(page);
        expect(found.length, `${c.name} ${url}\n${describeViolations(found)}`).toBe(0);
      } finally {
        await page.close();
      }
    });
  }
});
