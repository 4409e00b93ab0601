import { can, type Permission, type Role } from "@/lib/permissions";

export type NavItem = { href: string; label: string; needs: Permission };

// The console's sections, in order. A role sees an item only when the permissions table lets it.
export const NAV_ITEMS: NavItem[] = [
  { href: "/", label: "Overview", needs: "read" },
  { href: "/sites", label: "Sites", needs: "read" },
  { href: "/fleet", label: "Fleet", needs: "read" },
  { href: "/profiles", label: "Profiles", needs: "read" },
  { href: "/workbench", label: "Workbench", needs: "read" },
  { href: "/estimates", label: "Uplink and storage", needs: "read" },
  { href: "/audit", label: "Audit log", needs: "read" },
  { href: "/admin/users", label: "Users", needs: "fleet.admin" },
  { href: "/admin/mail", label: "Mail", needs: "fleet.admin" },
];

export function navFor(role: Role): NavItem[] {
  return NAV_ITEMS.filter((item) => can(role, item.needs));
}
