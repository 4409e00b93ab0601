import { authorize } from "@/lib/auth/guard";
import { allTagValues, siteBySlug } from "@/lib/data/tags";
import { route } from "@/lib/http";
import { exportTagsCsv } from "@/lib/tags/csv";

type Ctx = { params: Promise<{ site: string }> };

// GET /api/sites/[site]/tags/export – the inventory as CSV (formula-looking cells neutralised)
export const GET = route<Ctx>(async (req, { params }) => {
  await authorize("read", req);
  const site = await siteBySlug((await params).site);
  const csv = exportTagsCsv(await allTagValues(site.id));
  return new Response(csv, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${site.slug}-tags.csv"`,
      "Cache-Control": "no-store",
    },
  });
});
