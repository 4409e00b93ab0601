import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { createUser, listUsers } from "@/lib/data/users";
import { readJson, route } from "@/lib/http";
import type { CreateUserInput } from "@/schemas/user";

// GET /api/users – every account (admins only)
export const GET = route(async (req) => {
  const actor = await authorize("fleet.admin", req);
  return NextResponse.json({ users: await listUsers(actor) });
});

// POST /api/users – create an account; the generated password is in this response only
export const POST = route(async (req) => {
  const actor = await authorize("fleet.admin", req);
  const created = await createUser(actor, (await readJson(req)) as CreateUserInput);
  return NextResponse.json(created, { status: 201, headers: { "Cache-Control": "no-store" } });
});
