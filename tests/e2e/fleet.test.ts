import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

// The models reach the test database through DATABASE_URL (set for browser runs by
// scripts/stack.mjs); they import "server-only", which throws outside a server bundle.
vi.mock("server-only", () => ({}));

const SITE = "fenwick-creamery";
const GATEWAY = "fw-gw-02"; // the agent's browser test checks fw-gw-01 in
const MESSAGE = "e2e: bundle did not apply (output directory is read-only)";
const UNKNOWN = "E2E/FLEET-ONLY/PV";

type Models = typeof import("@/models");
type Saved = Record<string, unknown>;
const COLUMNS = ["runningRelease", "runningDigest", "appliedAt", "lastCheckInAt", "lastStatus", "lastMessage", "failingSince", "unknownTags", "failureMailedAt", "staleMailedAt"] as const;

/** The rows of the gateway table, as [gateway slug, state text]. */
async function rows(page: Page): Promise<[string, string][]> {
  return page.evaluate(() =>
    [...document.querySelectorAll('table[aria-label="Gateways"] tbody tr')].map((tr) => [
      tr.querySelector("th .font-mono")?.textContent ?? "",
      tr.querySelector("[data-state]")?.textContent ?? "",
    ]),
  );
}

describe("the fleet page", () => {
  let browser: Browser;
  let models: Models;
  let saved: Saved;
  let release: number;

  beforeAll(async () => {
    models = await import("@/models");
    const gw = (await models.Gateway.findOne({ where: { slug: GATEWAY } }))!;
    saved = Object.fromEntries(COLUMNS.map((c) => [c, gw.get(c)]));
    const bundle = (await models.Bundle.findByPk(gw.currentBundleId!))!;
    release = (await models.Release.findByPk(bundle.releaseId))!.number;
    const now = Date.now();
    // What the check-in write path leaves after a failed report from a gateway that ran the target before.
    await models.Gateway.update(
      {
        runningRelease: release,
        runningDigest: bundle.digest,
        appliedAt: new Date(now - 3_600_000),
        lastCheckInAt: new Date(now - 20_000),
        lastStatus: "failed",
        lastMessage: MESSAGE,
        failingSince: new Date(now - 20_000),
        unknownTags: [UNKNOWN],
        failureMailedAt: null,
      },
      { where: { id: gw.id } },
    );
    browser = await launch();
  });

  afterAll(async () => {
    await browser?.close();
    if (saved) await models.Gateway.update(saved, { where: { slug: GATEWAY } });
    await models?.sequelize.close();
  });

  it("shows the running release and state of a failing gateway, filters by state and site, and counts alerts on the nav", { timeout: 120_000 }, async () => {
    const page = await browser.newPage();
    await signIn(page, DEMO.viewer);
    await page.getByRole("navigation", { name: "Console sections" }).getByRole("link", { name: /^Fleet/ }).click();
    await page.waitForURL((u) => u.pathname === "/fleet");
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toBe("Fleet");
    expect(await page.getByRole("note", { name: "Lossy reduction" }).textContent()).toContain("last good bundle");

    const row = page.getByTestId(`gateway-${SITE}-${GATEWAY}`);
    expect((await row.getByTestId("running-release").textContent())!).toContain(`release ${release}`);
    expect(await row.locator("[data-state]").textContent()).toBe("Failing");
    expect(await row.getByTestId("failure-message").textContent()).toContain(MESSAGE);
    const lastCheckIn = row.locator("time").filter({ hasText: /s ago$/ }).first();
    expect(await lastCheckIn.getAttribute("title")).toMatch(/^\d{4}-\d\d-\d\d \d\d:\d\d:\d\d UTC$/);
    await row.getByText("1 not in inventory").click();
    await row.getByRole("list", { name: /inventory lacks/ }).getByText(UNKNOWN).waitFor();

    // The badge counts the stale and failing gateways the unfiltered table shows.
    const all = await rows(page);
    const alerts = all.filter(([, state]) => state === "Failing" || state === "Stale").length;
    expect(alerts).toBeGreaterThanOrEqual(1);
    const fleetLink = page.getByRole("navigation", { name: "Console sections" }).getByRole("link", { name: /^Fleet/ });
    expect(await page.getByTestId("nav-badge-/fleet").textContent()).toBe(String(alerts));
    expect(await fleetLink.textContent()).toContain(`${alerts} ${alerts === 1 ? "gateway" : "gateways"} stale or failing`);
    await screenshot(page, "fleet");

    await page.locator('select[name="state"]').selectOption("failing");
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL((u) => u.searchParams.get("state") === "failing");
    const failing = await rows(page);
    expect(failing.map(([slug]) => slug)).toContain(GATEWAY);
    expect(failing.every(([, state]) => state === "Failing")).toBe(true);
    expect(failing.length).toBeLessThan(all.length);

    await page.locator('select[name="site"]').selectOption(SITE);
    await page.locator('select[name="state"]').selectOption("");
    await page.getByRole("button", { name: "Filter" }).click();
    await page.waitForURL((u) => u.searchParams.get("site") === SITE && !u.searchParams.get("state"));
    const fenwick = await rows(page);
    expect(fenwick.map(([slug]) => slug).sort()).toEqual(["fw-gw-01", "fw-gw-02"]);
    expect(await page.getByRole("list", { name: "Gateways per site" }).getByRole("listitem").filter({ hasText: "Fenwick" }).count()).toBe(1);
    await page.close();
  });

  it("has the server mail the failure once, from its own minute sweep", { timeout: 120_000 }, async () => {
    // instrumentation.ts starts the sweep in the app's process; it claims the failure before mailing.
    const deadline = Date.now() + 90_000;
    let mailedAt: Date | null = null;
    while (Date.now() < deadline && !mailedAt) {
      mailedAt = (await models.Gateway.findOne({ where: { slug: GATEWAY }, attributes: ["failureMailedAt"] }))!.failureMailedAt;
      if (!mailedAt) await new Promise((r) => setTimeout(r, 2000));
    }
    expect(mailedAt, "the app's sweep claimed the failing gateway within 90 s").not.toBeNull();
  });
});
