import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { importTags } from "@/lib/data/tag-import";
import { siteBySlug } from "@/lib/data/tags";
import { HttpError, readJson, route } from "@/lib/http";
import { checkCsvSize, parseTagCsv } from "@/lib/tags/csv";
import { Gateway } from "@/models";

type Ctx = { params: Promise<{ site: string }> };

const MAX_BODY = 20 * 1024 * 1024;

// POST /api/sites/[site]/tags/import – import the inventory, all or nothing.
// JSON { rows, remove?, dryRun? } from the console, or a CSV body (text/csv; ?dryRun=1, ?remove=all-missing) for automation.
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("config.edit", req);
  const { site: slug } = await params;
  const declared = Number(req.headers.get("content-length") ?? 0);
  if (declared > MAX_BODY * 3) throw new HttpError(413, "the request body is too large", "body");
  if ((req.headers.get("content-type") ?? "").startsWith("text/csv")) {
    const bytes = await req.arrayBuffer();
    const sizeError = checkCsvSize(bytes.byteLength);
    if (sizeError) throw new HttpError(413, sizeError, "file");
    const text = utf8(bytes);
    const site = await siteBySlug(slug);
    const gateways = (await Gateway.findAll({ where: { siteId: site.id }, attributes: ["slug"] })).map((g) => g.slug);
    const parsed = parseTagCsv(text, { gateways });
    if (parsed.errors.length) {
      const issues = parsed.errors.map((e) => ({ field: `line ${e.line}${e.field ? `.${e.field}` : ""}`, message: e.reason }));
      throw new HttpError(422, `${issues.length} bad row${issues.length === 1 ? "" : "s"}; nothing was imported. First: ${issues[0].field}: ${issues[0].message}`, issues[0].field, undefined, issues.slice(0, 500));
    }
    const url = new URL(req.url);
    const dryRun = url.searchParams.get("dryRun") === "1";
    let remove: string[] = [];
    if (url.searchParams.get("remove") === "all-missing") {
      remove = (await importTags(actor, slug, { rows: parsed.rows, dryRun: true })).missing;
    }
    return NextResponse.json(await importTags(actor, slug, { rows: parsed.rows, remove, dryRun }));
  }
  return NextResponse.json(await importTags(actor, slug, await readJson(req)));
});

/** The file as text; bytes that are not UTF-8 (a Windows-1252 "°C") are refused, not replaced by U+FFFD. */
function utf8(bytes: ArrayBuffer): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new HttpError(422, "The file is not UTF-8 text; save it as CSV UTF-8 and import it again.", "file");
  }
}
