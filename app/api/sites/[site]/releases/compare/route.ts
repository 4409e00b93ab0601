import { NextResponse } from "next/server";
import { z } from "zod";
import { authorize } from "@/lib/auth/guard";
import { compareReleases } from "@/lib/data/releases";
import { route } from "@/lib/http";

type Ctx = { params: Promise<{ site: string }> };
const querySchema = z.object({ from: z.coerce.number({ error: "from is a release number" }).int().positive(), to: z.coerce.number({ error: "to is a release number" }).int().positive() });

// GET /api/sites/[site]/releases/compare?from=&to= – two releases compared gateway by gateway
export const GET = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("read", req);
  const { from, to } = querySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  return NextResponse.json(await compareReleases(actor, (await params).site, from, to));
});
