import { NextResponse } from "next/server";
import { QueryTypes } from "sequelize";
import { sequelize } from "@/models";

export const dynamic = "force-dynamic";

// GET /api/health – liveness and database reachability (503 with Retry-After when the database is down)
export async function GET() {
  try {
    await sequelize.query("SELECT 1 AS up", { type: QueryTypes.SELECT });
    return NextResponse.json({ status: "ok" });
  } catch (err) {
    console.error("health check: database unreachable:", (err as Error).message);
    return NextResponse.json({ status: "degraded", error: "the database is unavailable" }, { status: 503, headers: { "Retry-After": "5" } });
  }
}
