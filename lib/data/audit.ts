import "server-only";
import { Op, QueryTypes, type WhereOptions } from "sequelize";
import type { Actor } from "@/lib/auth/guard";
import { can } from "@/lib/permissions";
import { AuditEvent, Site, sequelize } from "@/models";
import { auditQuerySchema } from "@/schemas/audit";
import { assertCan } from "./access";

export type AuditView = {
  id: number;
  at: string;
  actorEmail: string;
  action: string;
  entityType: string;
  entityLabel: string;
  siteSlug: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
};

export type AuditPage = { entries: AuditView[]; total: number; page: number; pageSize: number; pages: number };

/** Entries about users are for administrators only (DESIGN.md: everyone reads everything except tokens and users). */
function visibleTypes(actor: Actor) {
  return can(actor.role, "fleet.admin") ? {} : { entityType: { [Op.notIn]: ["user", "token"] } };
}

/** The audit log, newest first, filtered by site slug, actor e-mail, action and time. */
export async function listAudit(actor: Actor | null, raw: Record<string, unknown>): Promise<AuditPage> {
  assertCan(actor, "read");
  const q = auditQuerySchema.parse(raw);
  const where: WhereOptions[] = [visibleTypes(actor)];
  const sites = await Site.findAll({ attributes: ["id", "slug"] });
  const slugOf = new Map(sites.map((s) => [s.id, s.slug]));
  if (q.site) {
    const site = sites.find((s) => s.slug === q.site);
    // A deleted site's history is still found through the entries that name it.
    if (site) where.push({ siteId: site.id });
    else where.push({ entityType: "site", entityLabel: q.site });
  }
  if (q.user) where.push({ actorEmail: q.user });
  if (q.action) where.push({ action: q.action });
  if (q.from) where.push({ createdAt: { [Op.gte]: q.from } });
  if (q.to) where.push({ createdAt: { [Op.lte]: q.to } });
  const { rows, count } = await AuditEvent.findAndCountAll({
    where: { [Op.and]: where },
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  return {
    entries: rows.map((r) => ({
      id: r.id,
      at: r.createdAt.toISOString(),
      actorEmail: r.actorEmail,
      action: r.action,
      entityType: r.entityType,
      entityLabel: r.entityLabel,
      siteSlug: r.siteId ? (slugOf.get(r.siteId) ?? null) : null,
      before: r.beforeJson,
      after: r.afterJson,
    })),
    total: count,
    page: q.page,
    pageSize: q.pageSize,
    pages: Math.max(1, Math.ceil(count / q.pageSize)),
  };
}

/** Values for the filter menus: actions and actors that appear in the log. */
export async function auditFacets(actor: Actor | null): Promise<{ actions: string[]; users: string[] }> {
  assertCan(actor, "read");
  const hidden = can(actor.role, "fleet.admin") ? "" : "WHERE entity_type NOT IN ('user','token')";
  const actions = await sequelize.query<{ v: string }>(`SELECT DISTINCT action AS v FROM audit_events ${hidden} ORDER BY v`, {
    type: QueryTypes.SELECT,
  });
  const users = await sequelize.query<{ v: string }>(`SELECT DISTINCT actor_email AS v FROM audit_events ${hidden} ORDER BY v`, {
    type: QueryTypes.SELECT,
  });
  return { actions: actions.map((a) => a.v), users: users.map((u) => u.v) };
}
