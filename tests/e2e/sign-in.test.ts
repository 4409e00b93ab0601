import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

describe("sign-in and navigation by role", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("sends a signed-out visitor to the sign-in page", async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/sites`);
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    expect(new URL(page.url()).searchParams.get("next")).toBe("/sites");
    expect(await page.getByRole("heading", { name: "Sign in to the console" }).isVisible()).toBe(true);
    await screenshot(page, "sign-in");
    await page.close();
  });

  it("refuses a wrong password with a message on the page", async () => {
    const page = await browser.newPage();
    await page.goto(`${BASE_URL}/sign-in`);
    await page.getByLabel("E-mail").fill(DEMO.viewer.email);
    await page.getByLabel("Password").fill("not-the-password");
    await page.getByRole("button", { name: "Sign in" }).click();
    const alert = page.locator("form").getByRole("alert");
    await alert.waitFor();
    expect(await alert.textContent()).toContain("do not match an active account");
    expect(new URL(page.url()).pathname).toBe("/sign-in");
    await page.close();
  });

  const expectedNav = {
    admin: ["Overview", "Sites", "Fleet", "Profiles", "Workbench", "Uplink and storage", "Audit log", "Users", "Mail"],
    reviewer: ["Overview", "Sites", "Fleet", "Profiles", "Workbench", "Uplink and storage", "Audit log"],
    engineer: ["Overview", "Sites", "Fleet", "Profiles", "Workbench", "Uplink and storage", "Audit log"],
    viewer: ["Overview", "Sites", "Fleet", "Profiles", "Workbench", "Uplink and storage", "Audit log"],
  } as const;

  for (const role of ["admin", "reviewer", "engineer", "viewer"] as const) {
    it(`shows the ${role} the navigation of that role`, async () => {
      const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      await signIn(page, DEMO[role]);
      const nav = page.getByRole("navigation", { name: "Console sections" });
      // Fleet may carry a badge of stale or failing gateways (other browser tests check gateways in); it is not part of the label.
      const labels = (await nav.getByRole("link").allTextContents()).map((s) => s.trim().replace(/\d+, \d+ gateways? stale or failing$/, ""));
      expect(labels).toEqual(expectedNav[role]);
      expect(await page.getByTestId("signed-in-as").textContent()).toContain(DEMO[role].name);
      expect(await page.getByTestId("signed-in-as").textContent()).toContain(role);
      // The demo co-operative's plants are on the overview.
      const sites = page.getByRole("list", { name: "Sites" });
      expect(await sites.getByRole("link").allTextContents()).toEqual(
        expect.arrayContaining(["Fenwick Creamery", "Osterby Cheese Works", "Kestrel Ridge Milk Powder"]),
      );
      await screenshot(page, `overview-${role}`);
      // Typing the address of an admin page does not reveal it to other roles.
      await page.goto(`${BASE_URL}/admin/users`);
      const heading = await page.getByRole("heading", { level: 1 }).textContent();
      expect(heading).toBe(role === "admin" ? "Users" : "Not available to your role");
      await page.getByRole("button", { name: "Sign out" }).click();
      await page.waitForURL((url) => url.pathname === "/sign-in");
      await context.close();
    });
  }
});
