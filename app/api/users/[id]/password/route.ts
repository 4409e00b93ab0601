import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { resetPassword } from "@/lib/data/users";
import { route, urlId } from "@/lib/http";

type Ctx = { params: Promise<{ id: string }> };

// POST /api/users/[id]/password – replace the password with a generated one, shown in this response only
export const POST = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const id = urlId((await params).id, "id");
  return NextResponse.json(await resetPassword(actor, id), { headers: { "Cache-Control": "no-store" } });
});
