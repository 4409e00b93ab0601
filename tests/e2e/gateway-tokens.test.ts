import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

/** A fresh site with one gateway, made through the API as the signed-in admin (the demo sites stay as they are). */
async function freshGateway(page: Page) {
  const id = randomUUID().slice(0, 6);
  const site = `tokens-${id}`;
  const gateway = `tk-gw-${id}`;
  const s = await page.request.post(`${BASE_URL}/api/sites`, {
    data: { name: `Token Test Dairy ${id}`, slug: site, timeZone: "Europe/Dublin", uplinkBudgetKbps: 256, storagePricePerGbMonth: 0.02, retentionMonths: 12, defaultHandling: "pass-through" },
  });
  expect(s.status()).toBe(201);
  const g = await page.request.post(`${BASE_URL}/api/sites/${site}/gateways`, { data: { name: `Separator gateway ${id}`, slug: gateway, description: "", pollSeconds: 60 } });
  expect(g.status()).toBe(201);
  return { site, gateway, name: `Separator gateway ${id}` };
}

describe("gateway tokens in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("an admin issues a token, sees it once, then finds only its prefix and revokes it", async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } });
    await signIn(page, DEMO.admin);
    const { site, gateway, name } = await freshGateway(page);
    await page.goto(`${BASE_URL}/sites/${site}/gateways/${gateway}`);
    const panel = page.getByRole("region", { name: "Tokens", exact: true });
    await panel.waitFor();
    expect(await panel.getByText("No tokens yet").isVisible()).toBe(true);
    expect(await panel.getByText("To rotate:").isVisible()).toBe(true);

    await panel.getByLabel("Token label").fill("x".repeat(121));
    await panel.getByRole("button", { name: "Issue token" }).click();
    expect(await page.locator("#token-label-error").textContent()).toContain("120");

    await panel.getByLabel("Token label").fill("line 3 edge box");
    await panel.getByRole("button", { name: "Issue token" }).click();
    const field = page.getByTestId("issued-token");
    await field.waitFor();
    const token = await field.inputValue();
    expect(token).toMatch(/^sgw_[A-Za-z0-9_-]{43}$/);
    expect(await field.getAttribute("readonly")).not.toBeNull();
    expect(await panel.getByText("Shown only now.").isVisible()).toBe(true);
    const prefix = token.slice(0, 12);
    const row = panel.getByTestId(`token-${prefix}`);
    await row.waitFor();
    expect(await row.textContent()).toContain("live");
    expect(await row.textContent()).toContain("line 3 edge box");
    expect(await row.textContent()).toContain(`${prefix}…`);
    expect(await row.textContent()).not.toContain(token);
    await screenshot(page, "gateway-token-issued");

    // After a reload the token is gone for good; the prefix stays listed.
    await page.reload();
    await panel.waitFor();
    expect(await page.getByTestId("issued-token").count()).toBe(0);
    expect(await page.content()).not.toContain(token.slice(12));
    expect(await row.textContent()).toContain("live");

    await row.getByRole("button", { name: "Revoke" }).click();
    const dialog = page.getByRole("dialog", { name: `Revoke token ${prefix}…?` });
    expect(await dialog.textContent()).toContain(`${name} is refused with this token`);
    expect(await dialog.textContent()).toContain("last live token");
    await dialog.getByRole("button", { name: "Revoke token" }).click();
    await row.getByText("revoked", { exact: true }).waitFor();
    expect(await row.getByRole("button", { name: "Revoke" }).count()).toBe(0);
    expect(await row.textContent()).toContain(`by ${DEMO.admin.name}`);
    await page.reload();
    await panel.waitFor();
    expect(await row.getByText("revoked", { exact: true }).isVisible()).toBe(true);
    expect(await panel.getByText("0 live, 1 revoked").isVisible()).toBe(true);
    await screenshot(page, "gateway-token-revoked");

    // A token with a lifetime shows when it expires.
    await panel.getByLabel("Expires").selectOption({ label: "after 90 days" });
    await panel.getByRole("button", { name: "Issue token" }).click();
    const second = (await page.getByTestId("issued-token").inputValue()).slice(0, 12);
    const expiring = panel.getByTestId(`token-${second}`);
    await expiring.waitFor();
    expect(await expiring.textContent()).toMatch(/live\s*expires /);
    expect(await panel.getByText("1 live, 1 revoked").isVisible()).toBe(true);
    await page.close();
  });

  it("a viewer sees no tokens panel on a gateway page", async () => {
    const page = await browser.newPage({ viewport: { width: 1024, height: 768 } });
    await signIn(page, DEMO.viewer);
    await page.goto(`${BASE_URL}/sites/fenwick-creamery/gateways/fw-gw-01`);
    await page.getByRole("heading", { level: 2, name: "Process hall gateway" }).waitFor();
    expect(await page.getByRole("region", { name: "Tokens", exact: true }).count()).toBe(0);
    expect(await page.getByText("To rotate:").count()).toBe(0);
    const res = await page.request.get(`${BASE_URL}/api/sites/fenwick-creamery/gateways/fw-gw-01/tokens`);
    expect(res.status()).toBe(403);
    await page.close();
  });
});
