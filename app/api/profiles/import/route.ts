import { NextResponse } from "next/server";
import { authorize } from "@/lib/auth/guard";
import { importProfile } from "@/lib/data/profile-import";
import { HttpError, route } from "@/lib/http";

/** Largest profile file accepted. */
const MAX_BYTES = 256 * 1024;

// POST /api/profiles/import – import one profile from a YAML file (body: the file; ?note=)
export const POST = route(async (req) => {
  const actor = await authorize("config.edit", req);
  const length = Number(req.headers.get("content-length") ?? "0");
  if (length > MAX_BYTES) throw new HttpError(413, `a profile file is at most ${MAX_BYTES / 1024} KB`, "file");
  const text = await req.text();
  if (Buffer.byteLength(text) > MAX_BYTES) throw new HttpError(413, `a profile file is at most ${MAX_BYTES / 1024} KB`, "file");
  if (text.trim() === "") throw new HttpError(422, "the file is empty", "file");
  const note = new URL(req.url).searchParams.get("note") ?? "";
  const result = await importProfile(actor, text, note.slice(0, 500));
  return NextResponse.json(result, { status: result.outcome === "created" ? 201 : 200 });
});
