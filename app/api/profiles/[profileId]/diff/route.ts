import { NextResponse } from "next/server";
import { z } from "zod";
import { authorize } from "@/lib/auth/guard";
import { diffRevisions } from "@/lib/data/profiles";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ profileId: string }> };
const querySchema = z.object({ from: z.coerce.number({ error: "from is a revision number" }).int().positive(), to: z.coerce.number({ error: "to is a revision number" }).int().positive() });

// GET /api/profiles/[profileId]/diff?from=&to= – two revisions compared, in words and line by line
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { from, to } = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return NextResponse.json(await diffRevisions(actor, urlId((await params).profileId, "profile"), from, to));
});
