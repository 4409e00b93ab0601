import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { listAudit } from "@/lib/data/audit";
import { route } from "@/lib/http";

// GET /api/audit – the audit log, filtered (site, user, action, from, to) and paged (page, pageSize)
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  const query = Object.fromEntries(new URL(req.url).searchParams);
  return NextResponse.json(await listAudit(actor, query));
});
