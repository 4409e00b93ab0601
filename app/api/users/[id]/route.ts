import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { updateUser } from "@/lib/data/users";
import { readJson, route, urlId } from "@/lib/http";
import type { UpdateUserInput } from "@/schemas/user";

type Ctx = { params: Promise<{ id: string }> };

// PATCH /api/users/[id] – change name, role or active flag (never the last active admin away)
export const PATCH = route<Ctx>(async (req, { params }) => {
  const actor = await authorize("fleet.admin", req);
  const id = urlId((await params).id, "id");
  return NextResponse.json(await updateUser(actor, id, (await readJson(req)) as UpdateUserInput));
});
