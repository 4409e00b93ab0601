import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { route } from "@/lib/http";

// GET /api/me – the signed-in user as the database has them now
export const GET = route(async (req) => {
  const actor = await authorize("read", req);
  return NextResponse.json(actor);
});
