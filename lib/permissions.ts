// The single source of what each role may do (DESIGN.md "Roles"). The guard reads it,
// the navigation reads it, and the role-matrix test walks it.

export const ROLES = ["viewer", "engineer", "reviewer", "admin"] as const;
export type Role = (typeof ROLES)[number];

export const PERMISSIONS = {
  /** Read everything except tokens and users. */
  read: ["viewer", "engineer", "reviewer", "admin"],
  /** Tags, groups, profiles, assignments, drafts. */
  "config.edit": ["engineer", "admin"],
  /** Submit a change for review. */
  "change.submit": ["engineer", "admin"],
  /** Approve or reject (not one's own), release, roll back. */
  "change.review": ["reviewer", "admin"],
  /** Users, sites, gateways, tokens, signing key. */
  "fleet.admin": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

/** Who may call a route: a permission, anyone ("public"), or a gateway token ("gateway"). */
export type Access = Permission | "public" | "gateway";

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}

/**
 * Every route handler, as "METHOD /path" with the file-system path of its route.ts.
 * A route that is not listed here fails the role-matrix test.
 */
export const ROUTE_ACCESS: Record<string, Access> = {
  "GET /api/auth/[...nextauth]": "public",
  "POST /api/auth/[...nextauth]": "public",
  "GET /api/health": "public",
  "GET /api/me": "read",
  "GET /api/audit": "read",
  "GET /api/users": "fleet.admin",
  "POST /api/users": "fleet.admin",
  "PATCH /api/users/[id]": "fleet.admin",
  "POST /api/users/[id]/password": "fleet.admin",
  "GET /api/sites": "read",
  "POST /api/sites": "fleet.admin",
  "GET /api/sites/[site]": "read",
  "PATCH /api/sites/[site]": "fleet.admin",
  "DELETE /api/sites/[site]": "fleet.admin",
  "GET /api/sites/[site]/gateways": "read",
  "POST /api/sites/[site]/gateways": "fleet.admin",
  "GET /api/sites/[site]/gateways/[gateway]": "read",
  "PATCH /api/sites/[site]/gateways/[gateway]": "fleet.admin",
  "DELETE /api/sites/[site]/gateways/[gateway]": "fleet.admin",
  "GET /api/sites/[site]/gateways/[gateway]/tokens": "fleet.admin",
  "POST /api/sites/[site]/gateways/[gateway]/tokens": "fleet.admin",
  "DELETE /api/sites/[site]/gateways/[gateway]/tokens/[tokenId]": "fleet.admin",
  "GET /api/sites/[site]/tags": "read",
  "POST /api/sites/[site]/tags": "config.edit",
  "DELETE /api/sites/[site]/tags": "config.edit",
  "PATCH /api/sites/[site]/tags/[tagId]": "config.edit",
  "DELETE /api/sites/[site]/tags/[tagId]": "config.edit",
  "POST /api/sites/[site]/tags/import": "config.edit",
  "GET /api/sites/[site]/tags/export": "read",
  "GET /api/sites/[site]/groups": "read",
  "POST /api/sites/[site]/groups": "config.edit",
  "GET /api/sites/[site]/groups/[groupId]": "read",
  "PATCH /api/sites/[site]/groups/[groupId]": "config.edit",
  "DELETE /api/sites/[site]/groups/[groupId]": "config.edit",
  "PUT /api/sites/[site]/groups/order": "config.edit",
  "POST /api/sites/[site]/groups/preview": "read",
  "GET /api/sites/[site]/coverage": "read",
  "GET /api/sites/[site]/draft": "read",
  "POST /api/sites/[site]/draft/discard": "config.edit",
  "GET /api/sites/[site]/assignments": "read",
  "GET /api/sites/[site]/groups/[groupId]/assignment": "read",
  "PUT /api/sites/[site]/groups/[groupId]/assignment": "config.edit",
  "DELETE /api/sites/[site]/groups/[groupId]/assignment": "config.edit",
  "GET /api/sites/[site]/groups/[groupId]/samples": "read",
  "POST /api/sites/[site]/groups/[groupId]/samples": "config.edit",
  "GET /api/sample-sets/[sampleSetId]": "read",
  "DELETE /api/sample-sets/[sampleSetId]": "config.edit",
  "GET /api/sample-sets/[sampleSetId]/data": "read",
  "GET /api/sites/[site]/estimate": "read",
  "GET /api/estimates": "read",
  "GET /api/fleet": "read",
  "GET /api/sites/[site]/changes": "read",
  "POST /api/sites/[site]/changes": "change.submit",
  "GET /api/sites/[site]/changes/[changeId]": "read",
  "POST /api/sites/[site]/changes/[changeId]/approve": "change.review",
  "POST /api/sites/[site]/changes/[changeId]/reject": "change.review",
  "POST /api/sites/[site]/changes/[changeId]/release": "change.review",
  "GET /api/sites/[site]/releases": "read",
  "GET /api/sites/[site]/releases/compare": "read",
  "GET /api/sites/[site]/releases/[number]/bundles/[gateway]": "read",
  "POST /api/sites/[site]/rollbacks": "change.review",
  "POST /api/sites/[site]/rollbacks/urgent": "change.review",
  "GET /api/profiles": "read",
  "POST /api/profiles": "config.edit",
  "POST /api/profiles/import": "config.edit",
  "GET /api/profiles/[profileId]": "read",
  "PATCH /api/profiles/[profileId]": "config.edit",
  "POST /api/profiles/[profileId]/revisions": "config.edit",
  "GET /api/profiles/[profileId]/revisions/[revision]": "read",
  "GET /api/profiles/[profileId]/diff": "read",
  "POST /api/profiles/[profileId]/duplicate": "config.edit",
  "GET /api/profiles/[profileId]/export": "read",
  "GET /api/gateway/v1/bundle": "gateway",
  "GET /api/gateway/v1/signing-key": "gateway",
  "PUT /api/gateway/v1/check-in": "gateway",
  "GET /api/gateway/v1/openapi.json": "public",
};

/**
 * Every server action, as "<actions file under app/>#<export>". A server action that is
 * not listed here fails the role-matrix test.
 */
export const ACTION_ACCESS: Record<string, Permission> = {
  "(console)/admin/users/actions.ts#createUserAction": "fleet.admin",
  "(console)/admin/users/actions.ts#updateUserAction": "fleet.admin",
  "(console)/admin/users/actions.ts#resetPasswordAction": "fleet.admin",
  "(console)/sites/actions.ts#createSiteAction": "fleet.admin",
  "(console)/sites/actions.ts#updateSiteAction": "fleet.admin",
  "(console)/sites/actions.ts#deleteSiteAction": "fleet.admin",
  "(console)/sites/actions.ts#createGatewayAction": "fleet.admin",
  "(console)/sites/actions.ts#updateGatewayAction": "fleet.admin",
  "(console)/sites/actions.ts#deleteGatewayAction": "fleet.admin",
  "(console)/sites/[site]/gateways/[gateway]/actions.ts#issueGatewayTokenAction": "fleet.admin",
  "(console)/sites/[site]/gateways/[gateway]/actions.ts#revokeGatewayTokenAction": "fleet.admin",
};
