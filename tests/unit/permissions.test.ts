import { describe, expect, it } from "vitest";
import { NAV_ITEMS, navFor } from "@/components/shell/nav-items";
import { ACTION_ACCESS, PERMISSIONS, ROLES, ROUTE_ACCESS, can } from "@/lib/permissions";

// DESIGN.md "Roles" table, row by row.
describe("permissions table", () => {
  it("matches the role table of the design", () => {
    const grid = Object.fromEntries(ROLES.map((r) => [r, Object.keys(PERMISSIONS).filter((p) => can(r, p as keyof typeof PERMISSIONS))]));
    expect(grid).toEqual({
      viewer: ["read"],
      engineer: ["read", "config.edit", "change.submit"],
      reviewer: ["read", "change.review"],
      admin: ["read", "config.edit", "change.submit", "change.review", "fleet.admin"],
    });
  });

  it("gives every route and action a known access level", () => {
    const known = new Set([...Object.keys(PERMISSIONS), "public", "gateway"]);
    for (const [key, access] of Object.entries(ROUTE_ACCESS)) {
      expect(key).toMatch(/^(GET|POST|PUT|PATCH|DELETE) \/api\//);
      expect(known.has(access), key).toBe(true);
    }
    for (const [key, access] of Object.entries(ACTION_ACCESS)) {
      expect(key).toMatch(/actions\.ts#\w+$/);
      expect(key in PERMISSIONS || known.has(access)).toBe(true);
    }
  });

  it("derives each role's navigation from the table", () => {
    expect(navFor("viewer").map((i) => i.label)).not.toContain("Users");
    expect(navFor("admin").map((i) => i.label)).toEqual(NAV_ITEMS.map((i) => i.label));
  });
});
