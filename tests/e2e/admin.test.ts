import { randomUUID } from "node:crypto";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

describe("administration in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("an admin creates a site and a gateway, then finds them in the switcher and the audit log", async () => {
    const id = randomUUID().slice(0, 6);
    const siteName = `Glenmere Butter Plant ${id}`;
    const siteSlug = `glenmere-${id}`;
    const gwSlug = `gl-gw-${id}`;
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, DEMO.admin);

    await page.goto(`${BASE_URL}/sites`);
    await page.getByRole("link", { name: "New site" }).click();
    await page.waitForURL(`${BASE_URL}/sites/new`);
    await page.getByLabel("Name", { exact: true }).fill(siteName);
    await page.getByLabel("Slug").fill("Not A Slug");
    await page.getByRole("button", { name: "Create site" }).click();
    // The form names the field at fault before anything is sent.
    expect(await page.locator("#site-slug-error").textContent()).toContain("Lower-case letters");
    await page.getByLabel("Slug").fill(siteSlug);
    await page.getByLabel("Time zone").selectOption("Europe/Dublin");
    await page.getByLabel("Uplink budget (kbit/s)").fill("384");
    await page.getByRole("button", { name: "Create site" }).click();
    await page.waitForURL(`${BASE_URL}/sites/${siteSlug}`);
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toBe(siteName);
    expect(await page.getByText(`Site ${siteName} created.`).isVisible()).toBe(true);
    expect(await page.getByText("No gateways at this site").isVisible()).toBe(true);

    await page.getByLabel("Gateway name").fill("Churn room gateway");
    await page.getByLabel("Gateway slug").fill(gwSlug);
    await page.getByLabel("Poll interval (s)").fill("90");
    await page.getByRole("button", { name: "Add gateway" }).click();
    await page.getByRole("link", { name: "Churn room gateway" }).waitFor();
    const row = page.getByRole("row", { name: /Churn room gateway/ });
    expect(await row.textContent()).toContain("90 s");

    const switcher = page.getByLabel("Switch site");
    const options = await switcher.locator("option").allTextContents();
    expect(options).toContain(siteName);
    await page.goto(`${BASE_URL}/`);
    await page.getByLabel("Switch site").selectOption({ label: siteName });
    await page.waitForURL(`${BASE_URL}/sites/${siteSlug}`);
    await screenshot(page, "admin-new-site");

    await page.goto(`${BASE_URL}/audit?site=${siteSlug}`);
    const entries = page.getByRole("list", { name: "Audit entries" }).getByRole("listitem");
    const texts = await entries.allTextContents();
    expect(texts).toHaveLength(2);
    expect(texts[0]).toContain("gateway.create");
    expect(texts[0]).toContain(gwSlug);
    expect(texts[1]).toContain("site.create");
    expect(texts[1]).toContain(DEMO.admin.email);
    await entries.nth(1).locator("summary").click();
    const added = await entries.nth(1).locator('[data-change="added"]').allTextContents();
    expect(added.join("\n")).toContain(`"slug": "${siteSlug}"`);
    await screenshot(page, "audit-log");
    await page.close();
  });

  it("a viewer sees no edit controls", async () => {
    const page = await browser.newPage({ viewport: { width: 1024, height: 768 } });
    await signIn(page, DEMO.viewer);
    await page.goto(`${BASE_URL}/sites`);
    expect(await page.getByRole("link", { name: "New site" }).count()).toBe(0);
    await page.goto(`${BASE_URL}/sites/fenwick-creamery`);
    expect(await page.getByRole("heading", { level: 1 }).textContent()).toBe("Fenwick Creamery");
    expect(await page.getByRole("link", { name: "Edit site settings" }).count()).toBe(0);
    expect(await page.getByRole("button", { name: "Add gateway" }).count()).toBe(0);
    expect(await page.getByRole("textbox").count()).toBe(0);
    await page.getByRole("link", { name: "Process hall gateway" }).click();
    await page.waitForURL(/\/gateways\/fw-gw-01$/);
    expect(await page.getByRole("button").allTextContents()).toEqual(["Sign out"]);
    await page.goto(`${BASE_URL}/sites/fenwick-creamery/settings`);
    expect(await page.getByRole("heading", { level: 2, name: "Not available to your role" }).isVisible()).toBe(true);
    expect(await page.getByRole("textbox").count()).toBe(0);
    await screenshot(page, "viewer-site");
    await page.close();
  });

  it("an admin resets a password and sees the new one once", async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await signIn(page, DEMO.admin);
    await page.goto(`${BASE_URL}/admin/users`);
    const email = `temp-${randomUUID().slice(0, 6)}@demo.invalid`;
    await page.getByLabel("Name", { exact: true }).fill("Temporary Operator");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Role", { exact: true }).selectOption("engineer");
    await page.getByRole("button", { name: "Create account" }).click();
    const secret = page.getByTestId("secret-value");
    await secret.waitFor();
    expect(await secret.inputValue()).toMatch(/^[A-Za-z0-9_-]{16}$/);
    const row = page.getByTestId(`user-${email}`);
    await row.waitFor();
    await row.getByRole("button", { name: "Deactivate" }).click();
    await page.getByRole("dialog").getByRole("button", { name: "Deactivate" }).click();
    await row.getByRole("button", { name: "Reactivate" }).waitFor();
    expect(await row.textContent()).toContain("deactivated");
    await screenshot(page, "users");
    await page.close();
  });
});
