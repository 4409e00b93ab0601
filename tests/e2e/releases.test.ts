import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

/** The text of every added and removed line in the unified diffs on the page. */
function changedLines(page: Page): Promise<string[]> {
  return page.evaluate(() =>
    [...document.querySelectorAll('table[aria-label^="Unified diff"] tr[data-kind="added"], table[aria-label^="Unified diff"] tr[data-kind="removed"]')].map(
      (tr) => (tr.lastElementChild?.textContent ?? "").replace(/^(added|removed): /, ""),
    ),
  );
}

async function asUser(browser: Browser, who: { email: string; password: string }): Promise<Page> {
  const page = await browser.newPage();
  await signIn(page, who);
  return page;
}

/** Submits the site's draft change from the Draft change page; returns the change page's address. */
async function submitDraft(page: Page, site: string, note: string): Promise<string> {
  await page.goto(`${BASE_URL}/sites/${site}/draft`);
  await page.getByLabel("Note for reviewers").fill(note);
  await page.getByRole("button", { name: "Submit for review" }).click();
  // Either the change page opens or the form says why the server refused.
  const refused = page.getByRole("form", { name: "Submit for review" }).getByRole("alert");
  await Promise.race([page.waitForURL(/\/changes\/\d+$/, { timeout: 45_000 }), refused.waitFor({ timeout: 45_000 })]);
  if (!/\/changes\/\d+$/.test(page.url())) throw new Error(`submitting ${site}'s draft was refused: ${await refused.textContent()}`);
  return page.url();
}

/** Approves (acknowledging the regulated-record caution) and releases from the change page. */
async function approveAndRelease(page: Page, changeUrl: string, release: number) {
  await page.goto(changeUrl);
  await page.getByLabel(/acknowledge it for/).check();
  await page.getByRole("button", { name: "Approve change" }).click();
  await page.getByTestId("change-state").filter({ hasText: "Approved" }).waitFor();
  await page.getByRole("button", { name: `Release as release ${release}` }).click();
  await page.getByRole("button", { name: "Release", exact: true }).click();
  await page.getByRole("link", { name: `Released as release ${release}` }).waitFor({ timeout: 30_000 });
}

describe("review a change and roll back, in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("submits Osterby's first change, reviews its summary, caution, diffs and impact, approves with the acknowledgement and releases it", { timeout: 240_000 }, async () => {
    const site = "osterby-cheese";
    const eli = await asUser(browser, DEMO.engineer);
    const changeUrl = await submitDraft(eli, site, "First configuration of the cheese plant.");
    expect(await eli.getByTestId("change-state").textContent()).toBe("In review");
    expect(await eli.getByRole("region", { name: "Decision" }).textContent()).toContain("waiting for another reviewer");
    expect(await eli.getByRole("button", { name: "Approve change" }).count()).toBe(0);
    await eli.close();

    const rui = await asUser(browser, DEMO.reviewer);
    await rui.goto(changeUrl);
    const summary = rui.getByRole("list", { name: "Change summary" });
    expect(await summary.textContent()).toContain('Group "thermiser-temperatures" added as a regulated record');
    expect(await summary.locator('li[data-regulated="true"]').count()).toBeGreaterThan(0);
    const caution = rui.getByRole("note", { name: "Regulated record" });
    expect(await caution.textContent()).toContain("keep the raw record");
    expect(await caution.textContent()).toContain("thermiser-temperatures");

    // Every bundle is new: its added lines name the site, and the milk-treatment gateway's the regulated group.
    const gw1 = rui.getByRole("table", { name: "Unified diff for os-gw-01" });
    expect(await gw1.locator('tr[data-kind="added"]').filter({ hasText: "site: osterby-cheese" }).count()).toBe(1);
    const added = await changedLines(rui);
    expect(added.some((l) => l.includes("thermiser-temperatures"))).toBe(true);
    expect(await rui.getByRole("table", { name: "Unified diff for os-gw-01" }).locator('tr[data-kind="removed"]').count()).toBe(0);
    await rui.getByLabel("Side by side", { exact: true }).check();
    await rui.getByRole("table", { name: "Side-by-side diff for os-gw-01" }).waitFor();
    await rui.getByLabel("Unified", { exact: true }).check();

    const impact = rui.getByRole("region", { name: /Impact/ });
    expect(await impact.textContent()).toContain("estimates");
    expect(await rui.getByRole("table", { name: "Bandwidth and storage impact" }).textContent()).toContain("Mean uplink (kbit/s)");
    await screenshot(rui, "change-review");

    // A reason is required to reject; approving waits for the acknowledgement.
    await rui.getByRole("button", { name: "Reject change" }).click();
    expect(await rui.getByRole("alert").filter({ hasText: "Say why the change is rejected." }).count()).toBe(1);
    expect(await rui.getByRole("button", { name: "Approve change" }).isDisabled()).toBe(true);
    await approveAndRelease(rui, changeUrl, 1);
    expect(await rui.getByTestId("change-state").textContent()).toBe("Released");
    expect(await rui.locator('dl[aria-label="Change history"]').textContent()).toContain(`Approved`);
    expect(await rui.locator('dl[aria-label="Change history"]').textContent()).toContain(DEMO.reviewer.name);

    await rui.getByRole("navigation", { name: "Site sections" }).getByRole("link", { name: "Releases" }).click();
    await rui.waitForURL(`${BASE_URL}/sites/${site}/releases`);
    const row = rui.getByTestId("release-1");
    expect(await row.textContent()).toContain(DEMO.reviewer.name);
    const link = row.getByRole("link", { name: /^os-gw-01 bundle of release 1/ });
    const yaml = await rui.evaluate(async (href) => (await fetch(href)).text(), (await link.getAttribute("href"))!);
    expect(yaml).toMatch(/^sluice: bundle\/1\n/);
    expect(yaml).toContain("release: 1\n");
    expect(await row.getByRole("list", { name: "Bundles of release 1" }).getByRole("link").count()).toBe(3);
    await screenshot(rui, "releases-first");
    await rui.close();
  });

  it("releases an upgrade at Fenwick, then an admin rolls back to release 1 urgently; the compare shows only release and issue time differ", { timeout: 300_000 }, async () => {
    const site = "fenwick-creamery";
    const eli = await asUser(browser, DEMO.engineer);
    const status = await eli.evaluate(async (site) => {
      const profiles = (await (await fetch("/api/profiles")).json()).profiles as { id: number; name: string }[];
      const groups = (await (await fetch(`/api/sites/${site}/assignments`)).json()).groups as { groupId: number; group: string }[];
      const profileId = profiles.find((p) => p.name === "Temperature shape")!.id;
      const groupId = groups.find((g) => g.group === "cip-temperatures")!.groupId;
      const res = await fetch(`/api/sites/${site}/groups/${groupId}/assignment`, {
        method: "PUT",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ profileId, revision: 2, acknowledge: "regulated-record/1" }),
      });
      return res.status;
    }, site);
    expect(status).toBe(200);
    const changeUrl = await submitDraft(eli, site, "Tighter CIP temperature shape (revision 2).");
    expect(await eli.getByRole("list", { name: "Change summary" }).textContent()).toContain("cip-temperatures");
    await eli.close();

    const rui = await asUser(browser, DEMO.reviewer);
    await rui.goto(changeUrl);
    // Only the CIP gateway's bundle changes; the other's differs in release number and issue time alone.
    expect(await rui.getByTestId("gateway-diff-fw-gw-01").textContent()).toContain("no change in content");
    expect((await changedLines(rui)).some((l) => !/^(release|issued): /.test(l))).toBe(true);
    await screenshot(rui, "change-review-upgrade");
    await approveAndRelease(rui, changeUrl, 2);
    await rui.close();

    const ada = await asUser(browser, DEMO.admin);
    await ada.goto(`${BASE_URL}/sites/${site}/releases`);
    const urgent = ada.getByRole("group", { name: /Urgent: release the rollback/ });
    expect(await urgent.textContent()).toContain("bypasses the four-eyes rule");
    expect(await urgent.textContent()).toContain("every reviewer is e-mailed");
    expect(await ada.getByRole("button", { name: "Release rollback now" }).isDisabled()).toBe(true);
    await ada.getByLabel("Release to go back to").selectOption("1");
    const reason = "CIP return temperatures alarm after the upgrade; restoring release 1 tonight.";
    await ada.getByLabel("Reason for releasing without a second reviewer").fill(reason);
    await screenshot(ada, "rollback-panel");
    await ada.getByRole("button", { name: "Release rollback now" }).click();
    await ada.getByRole("button", { name: "Release without a second reviewer" }).click();
    const row = ada.getByTestId("release-3");
    await row.waitFor({ timeout: 30_000 });
    expect(await row.textContent()).toContain("rollback to 1");
    expect(await row.textContent()).toContain("current");
    expect(await row.getByTestId("urgent-flag").textContent()).toContain(reason);
    expect(await row.getByTestId("urgent-flag").textContent()).toContain("without a second reviewer");
    await screenshot(ada, "releases-after-rollback");

    await ada.getByLabel("From release").selectOption("1");
    await ada.getByLabel("To release").selectOption("3");
    await ada.getByRole("button", { name: "Compare" }).click();
    await ada.waitForURL(/\/releases\/compare\?from=1&to=3$/);
    const verdict = (await ada.getByTestId("compare-verdict").textContent()) ?? "";
    expect(verdict).toContain("only the release number and issue time differ");
    expect(verdict).not.toContain("no stored bundle");
    const lines = await changedLines(ada);
    expect(lines.length).toBe(8); // release and issued lines, removed and added, on both gateways
    for (const l of lines) expect(l).toMatch(/^(release|issued): /);
    await screenshot(ada, "compare-1-3");
    await ada.close();
  });
});
