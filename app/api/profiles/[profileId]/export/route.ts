import { authorize } from "@/lib/auth/guard";
import { exportProfile } from "@/lib/data/profiles";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string }> };

// GET /api/profiles/[profileId]/export?revision= – a revision (default latest) as a YAML file
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const revision = new URL(req.url).searchParams.get("revision");
  const { filename, text } = await exportProfile(actor, urlId((await params).profileId, "profile"), revision === null ? undefined : urlId(revision, "revision"));
  return new Response(text, {
    headers: { "Content-Type": "application/yaml; charset=utf-8", "Content-Disposition": `attachment; filename="${filename}"`, "Cache-Control": "no-store" },
  });
});
