import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

// A plant of our own for this test, so the demo inventory stays as seeded.
async function makeSite(browser: Browser) {
  const id = randomUUID().slice(0, 6);
  const page = await browser.newPage();
  await signIn(page, DEMO.admin);
  const post = (url: string, body: unknown) =>
    page.evaluate(async ([u, b]) => (await fetch(u as string, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(b) })).status, [url, body] as const);
  const slug = `e2e-dairy-${id}`;
  expect(await post("/api/sites", { name: `Test dairy ${id}`, slug, timeZone: "UTC", uplinkBudgetKbps: 100, storagePricePerGbMonth: 0.02, retentionMonths: 12, defaultHandling: "pass-through" })).toBe(201);
  expect(await post(`/api/sites/${slug}/gateways`, { name: "Gateway", slug: `e2e-gw-${id}`, description: "", pollSeconds: 60 })).toBe(201);
  await page.close();
  return { slug, gateway: `e2e-gw-${id}` };
}

const csvFile = (text: string) => ({ name: "plant-tags.csv", mimeType: "text/csv", buffer: Buffer.from(text) });

describe("tag inventory and groups in the browser", () => {
  let browser: Browser;
  let page: Page;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("imports a CSV after fixing a bad row, builds a group with a live count, and shows coverage", async () => {
    const { slug, gateway } = await makeSite(browser);
    page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, DEMO.engineer);
    await page.goto(`${BASE_URL}/sites/${slug}/tags/import`);

    // Headers that differ from ours, semicolons, and a bad engineering range on line 3.
    const header = "Tag Name;Units;Sample period (ms);Type;EU Low;EU High;Area;Equipment;Collector";
    const line2 = `PAST1/TT-101/PV;degC;1000;analog;0;150;PAST1;HX-01;${gateway}`;
    const bad3 = `PAST1/TT-102/PV;degC;1000;analog;150;0;PAST1;HX-01;${gateway}`;
    const good3 = `PAST1/TT-102/PV;degC;1000;analog;0;150;PAST1;HX-01;${gateway}`;
    const line4 = `CIP1/FT-201/PV;m3/h;1000;analog;0;60;CIP1;CS-01;${gateway}`;
    await page.getByLabel("CSV file", { exact: true }).setInputFiles(csvFile([header, line2, bad3, line4].join("\n")));
    await page.getByRole("button", { name: "Check the file" }).click();
    const problems = page.getByRole("list", { name: "Bad rows" });
    await problems.waitFor();
    const text = await problems.textContent();
    expect(text).toContain("line 3");
    expect(text?.toLowerCase()).toMatch(/low|high/);
    await screenshot(page, "import-bad-row");

    await page.getByLabel("CSV file", { exact: true }).setInputFiles(csvFile([header, line2, good3, line4].join("\n")));
    await page.getByRole("button", { name: "Check the file" }).click();
    await page.getByTestId("import-plan").waitFor();
    expect(await page.getByTestId("import-plan").textContent()).toContain("3 new");
    await page.getByRole("button", { name: "Import", exact: true }).click();
    await page.getByTestId("import-done").filter({ hasText: "Imported: 3 added" }).waitFor();

    await page.goto(`${BASE_URL}/sites/${slug}/tags`);
    await page.getByTestId("tag-count").filter({ hasText: "3 of 3 tags" }).waitFor();
    const names = await page.getByRole("table", { name: "Tag inventory" }).getByRole("row").allTextContents();
    expect(names.join(" ")).toContain("CIP1/FT-201/PV");

    // Inline edit: the row turns into inputs; a bad range is refused on the spot, a good one saved.
    await page.getByRole("button", { name: "Edit CIP1/FT-201/PV" }).click();
    const editor = page.getByRole("row", { name: "Editing CIP1/FT-201/PV" });
    await editor.getByLabel("Range high").fill("-5");
    await editor.getByRole("button", { name: "Save" }).click();
    expect(await editor.textContent()).toContain("low must be below high");
    await editor.getByLabel("Range high").fill("80");
    await editor.getByLabel("Unit").fill("l/min");
    await editor.getByRole("button", { name: "Save" }).click();
    await page.getByRole("row", { name: /CIP1\/FT-201\/PV/ }).filter({ hasText: "l/min" }).waitFor();
    expect(await page.getByRole("row", { name: /CIP1\/FT-201\/PV/ }).textContent()).toContain("0 … 80");

    await page.goto(`${BASE_URL}/sites/${slug}/groups/new`);
    await page.getByLabel("Group name").fill("pasteuriser-temperatures");
    await page.getByLabel("Tag name patterns").fill("PAST1/*/PV");
    await page.getByTestId("preview-count").filter({ hasText: "2 tags" }).waitFor();
    expect(await page.getByRole("list", { name: "Matched tags (sample)" }).textContent()).toContain("PAST1/TT-102/PV");
    await page.getByLabel("Tag name patterns").fill("PAST1/**/TT-101/PV");
    await page.getByTestId("preview-count").filter({ hasText: "1 tag" }).waitFor();
    await page.getByLabel("Tag name patterns").fill("PAST1/*/PV");
    await page.getByTestId("preview-count").filter({ hasText: "2 tags" }).waitFor();
    await screenshot(page, "group-editor");
    await page.getByRole("button", { name: "Create group" }).click();
    await page.waitForURL(`${BASE_URL}/sites/${slug}/groups`);
    expect(await page.getByTestId("group-count-pasteuriser-temperatures").textContent()).toContain("2 tags");
    expect(await page.getByTestId("draft-badge").textContent()).toContain("1 edit");
    expect(await page.getByRole("list", { name: "Draft edits" }).textContent()).toContain('Group "pasteuriser-temperatures" added');

    await page.getByRole("navigation", { name: "Site sections" }).getByRole("link", { name: "Coverage" }).click();
    await page.waitForURL(`${BASE_URL}/sites/${slug}/coverage`);
    expect(await page.getByTestId("coverage-summary").textContent()).toContain("2 of 3 tags are in a group; 1 in no group");
    expect(await page.getByRole("table", { name: "Tags in no group" }).textContent()).toContain("CIP1/FT-201/PV");
    await screenshot(page, "coverage");
    await page.close();
  });
});
