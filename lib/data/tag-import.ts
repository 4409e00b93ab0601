import "server-only";
import { Op } from "sequelize";
import { z } from "zod";
import { recordAudit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { Gateway, Tag, sequelize } from "@/models";
import { tagSchema, type TagValues } from "@/schemas/tag";
import { assertCan } from "./access";
import { allTagValues, siteBySlug } from "./tags";

export const MAX_IMPORT_ROWS = 200_000;

export const importSchema = z.object({
  rows: z.array(z.unknown()).max(MAX_IMPORT_ROWS, `At most ${MAX_IMPORT_ROWS.toLocaleString("en")} rows per import.`),
  /** Remove tags that are not in the file: the exact names the person was shown. */
  remove: z.array(z.string()).max(MAX_IMPORT_ROWS).default([]),
  dryRun: z.boolean().default(false),
});

export type ImportPlan = {
  added: string[];
  updated: string[];
  unchanged: number;
  /** Tags in the inventory that the file lacks: removed only when listed in `remove`. */
  missing: string[];
  removed: string[];
};

const FIELDS = ["unit", "samplePeriodMs", "kind", "euLow", "euHigh", "area", "equipment", "gateway"] as const;

/** Validates every row (all errors at once, by row index) and checks gateways and duplicates. */
function validateRows(rows: unknown[], gateways: Set<string>): TagValues[] {
  const out: TagValues[] = [];
  const issues: { field: string; message: string }[] = [];
  const seen = new Map<string, number>();
  rows.forEach((raw, i) => {
    const parsed = tagSchema.safeParse(raw);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) issues.push({ field: ["rows", i, ...issue.path].join("."), message: issue.message });
      return;
    }
    const v = parsed.data;
    if (!gateways.has(v.gateway)) issues.push({ field: `rows.${i}.gateway`, message: `unknown gateway "${v.gateway}" at this site` });
    const first = seen.get(v.name);
    if (first !== undefined) issues.push({ field: `rows.${i}.name`, message: `duplicate name "${v.name}" (first in row ${first})` });
    else seen.set(v.name, i);
    out.push(v);
  });
  if (issues.length) {
    const summary = `${issues.length} row problem${issues.length === 1 ? "" : "s"}; nothing was imported. First: ${issues[0].field}: ${issues[0].message}`;
    throw new HttpError(422, summary, issues[0].field, undefined, issues.slice(0, 500));
  }
  return out;
}

/**
 * Imports a site's inventory, all or nothing: upserts by name, and removes the tags the
 * file lacks only when the request lists exactly those names (so nobody removes tags they
 * were not shown). With dryRun, only the plan comes back.
 */
export async function importTags(actor: Actor | null, siteSlug: string, input: unknown): Promise<ImportPlan> {
  assertCan(actor, "config.edit");
  const req = importSchema.parse(input);
  return sequelize.transaction(async (transaction) => {
    const site = await siteBySlug(siteSlug, transaction, true);
    const gws = await Gateway.findAll({ where: { siteId: site.id }, attributes: ["id", "slug"], transaction });
    const idOf = new Map(gws.map((g) => [g.slug, g.id]));
    const rows = validateRows(req.rows, new Set(idOf.keys()));
    const existing = new Map((await allTagValues(site.id, transaction)).map((t) => [t.name, t]));
    const inFile = new Set(rows.map((r) => r.name));
    const plan: ImportPlan = { added: [], updated: [], unchanged: 0, missing: [], removed: [] };
    for (const r of rows) {
      const old = existing.get(r.name);
      if (!old) plan.added.push(r.name);
      else if (FIELDS.some((f) => old[f] !== r[f])) plan.updated.push(r.name);
      else plan.unchanged++;
    }
    plan.missing = [...existing.keys()].filter((n) => !inFile.has(n)).sort();
    const remove = [...new Set(req.remove)].sort();
    if (remove.length) {
      const missing = new Set(plan.missing);
      const stray = remove.find((n) => !missing.has(n));
      if (stray !== undefined || remove.length !== plan.missing.length) {
        throw new HttpError(409, "The inventory changed since the removal list was shown; review the list again.", "remove");
      }
      plan.removed = remove;
    }
    if (req.dryRun) return plan;

    const changed = new Set([...plan.added, ...plan.updated]);
    const now = new Date();
    const upserts = rows
      .filter((r) => changed.has(r.name))
      .map((r) => ({ ...r, siteId: site.id, gatewayId: idOf.get(r.gateway)!, createdAt: now, updatedAt: now }));
    for (let i = 0; i < upserts.length; i += 2000) {
      await Tag.bulkCreate(upserts.slice(i, i + 2000), {
        transaction,
        updateOnDuplicate: ["unit", "samplePeriodMs", "kind", "euLow", "euHigh", "area", "equipment", "gatewayId", "updatedAt"],
      });
    }
    for (let i = 0; i < plan.removed.length; i += 2000) {
      await Tag.destroy({ where: { siteId: site.id, name: { [Op.in]: plan.removed.slice(i, i + 2000) } }, transaction });
    }
    const sample = (names: string[]) => names.slice(0, 100);
    await recordAudit(
      actor,
      {
        action: "tags.import",
        entityType: "site",
        entityId: site.id,
        entityLabel: `${rows.length} rows`,
        siteId: site.id,
        before: { tags: existing.size },
        after: {
          tags: existing.size + plan.added.length - plan.removed.length,
          added: plan.added.length,
          updated: plan.updated.length,
          unchanged: plan.unchanged,
          removed: plan.removed.length,
          addedNames: sample(plan.added),
          updatedNames: sample(plan.updated),
          removedNames: sample(plan.removed),
        },
      },
      transaction,
    );
    return plan;
  });
}
