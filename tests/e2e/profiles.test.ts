import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

const SITE = "fenwick-creamery";
const GROUP = "pasteuriser-temperatures";

async function groupId(page: Page): Promise<{ id: number; tag: string }> {
  return page.evaluate(
    async ([site, name]) => {
      const rows = (await (await fetch(`/api/sites/${site}/assignments`)).json()).groups as { groupId: number; group: string }[];
      const id = rows.find((r) => r.group === name)!.groupId;
      const detail = await (await fetch(`/api/sites/${site}/groups/${id}/assignment`)).json();
      return { id, tag: detail.tags[1].name as string };
    },
    [SITE, GROUP] as const,
  );
}

describe("assign a profile to a tag group, in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("builds a profile, assigns it to a regulated group with a tag override after the caution, and sees the draft grow", async () => {
    const page = await browser.newPage();
    await signIn(page, DEMO.engineer);
    const name = `Holding tube shape ${randomUUID().slice(0, 4)}`;

    // Build a profile: good samples only, then swinging door with an absolute deviation.
    await page.goto(`${BASE_URL}/profiles/new`);
    await page.getByLabel("Profile name").fill(name);
    await page.getByLabel("Description").fill("Shape of holding-tube temperatures.");
    await page.getByLabel("Name of output 1").fill("shape");
    await page.getByLabel("New step method for shape").selectOption({ label: "Quality filter" });
    await page.getByRole("button", { name: "Add step to shape" }).click();
    await page.getByRole("group", { name: /Step 1 of shape/ }).getByLabel("Keep").selectOption("good");
    await page.getByLabel("New step method for shape").selectOption({ label: "Swinging door" });
    await page.getByRole("button", { name: "Add step to shape" }).click();
    const door = page.getByRole("group", { name: /Step 2 of shape/ });
    await door.getByLabel("Deviation as an absolute value").check();
    await door.getByLabel("Deviation value").fill("0.1");
    await door.getByLabel("Deviation unit").fill("degC");
    await door.getByLabel("Max interval (s)").fill("300");
    // The method's help names its published source and what the parameter guarantees.
    expect(await door.textContent()).toContain("Bristol");
    await page.getByLabel("What changed").fill("First version");
    await screenshot(page, "profile-editor");
    await page.getByRole("button", { name: "Create profile" }).click();
    await page.waitForURL(/\/profiles\/\d+$/);
    const profileUrl = page.url();
    await page.getByRole("heading", { name }).waitFor();
    expect(await page.locator("main").textContent()).toContain("0.1 degC");

    // Its group at Fenwick is a regulated record; the release holds "Temperature shape" revision 1.
    const { id, tag } = await groupId(page);
    await page.goto(`${BASE_URL}/sites/${SITE}/assignments`);
    expect(await page.getByTestId(`assignment-${GROUP}`).textContent()).toContain("Temperature shape");
    expect(await page.getByTestId(`assignment-${GROUP}`).textContent()).toContain("revision 2 available");
    expect(await page.getByTestId("draft-badge").count()).toBe(0);
    await page.getByRole("link", { name: GROUP }).click();
    await page.waitForURL(`${BASE_URL}/sites/${SITE}/groups/${id}/assignment`);
    // The upgrade on offer shows what it changes.
    expect(await page.getByRole("list", { name: "What the upgrade changes" }).textContent()).toContain("deviation 0.3 degC → 0.2 degC");

    await page.getByLabel("Profile", { exact: true }).selectOption({ label: `${name} (analog)` });
    await page.getByTestId("assignment-outputs").filter({ hasText: "shape (Quality filter → Swinging door)" }).waitFor();
    await page.getByRole("button", { name: "Add tag override" }).click();
    await page.getByLabel("Tag (tag override 1)").fill(tag);
    await page.getByLabel("Parameter (tag override 1)").selectOption("shape|1|deviation");
    await page.getByLabel("Value (tag override 1)").fill("0.25");
    await page.getByLabel("Unit (tag override 1)").fill("degC");

    // A lossy profile on a regulated group: saving waits for the acknowledgement of the caution.
    const caution = page.getByRole("note", { name: "Regulated record" });
    expect(await caution.textContent()).toContain("keep the raw record");
    const save = page.getByRole("button", { name: "Save assignment to draft" });
    expect(await save.isDisabled()).toBe(true);
    await caution.getByLabel(/acknowledge it/).check();
    await screenshot(page, "assignment-editor");
    await save.click();
    await page.waitForURL(`${BASE_URL}/sites/${SITE}/assignments`);

    const row = page.getByTestId(`assignment-${GROUP}`);
    await row.filter({ hasText: name }).waitFor();
    expect(await row.textContent()).toContain("Caution acknowledged by eli.engineer@demo.invalid");
    expect(await page.getByTestId("draft-badge").textContent()).toContain("1 edit");
    await screenshot(page, "assignments");

    // The draft lists the edit and lets the engineer discard it.
    await page.getByTestId("draft-badge").click();
    await page.waitForURL(`${BASE_URL}/sites/${SITE}/draft`);
    const edits = page.getByRole("list", { name: "Draft edits" });
    expect(await edits.textContent()).toContain(`Group "${GROUP}": "Temperature shape" revision 1 → "${name}" revision 1`);
    await screenshot(page, "draft-change");
    await page.getByRole("button", { name: /^Discard: / }).click();
    await page.getByRole("button", { name: "Discard edit" }).click();
    await page.getByText(/No edits since release \d+/).waitFor();
    expect(await page.getByTestId("draft-badge").count()).toBe(0);

    // The profile page shows no use any more, and its revision history names the author.
    await page.goto(profileUrl);
    expect(await page.locator("main").textContent()).toContain(DEMO.engineer.name);
    await page.close();
  });

  it("shows a viewer the profile library without edit controls", async () => {
    const page = await browser.newPage();
    await signIn(page, DEMO.viewer);
    await page.goto(`${BASE_URL}/profiles`);
    const table = page.getByRole("table", { name: "Reduction profiles" });
    expect(await table.textContent()).toContain("1-minute statistics");
    expect(await page.getByRole("link", { name: "New profile" }).count()).toBe(0);
    await page.goto(`${BASE_URL}/sites/${SITE}/assignments`);
    expect(await page.getByTestId("assignment-vibration").textContent()).toContain("Vibration exceedances");
    await page.close();
  });
});
