import { sql } from "drizzle-orm";
import { getDb } from "@/db/client";

export const dynamic = "force-dynamic";

/** Answers 200 once the app and its database (with migrations applied) are ready. */
export async function GET() {
  try {
    const db = await getDb();
    await db.execute(sql`select 1`);
    return Response.json({ status: "ok", database: "ok" });
  } catch (err) {
    console.error("[plotproof] health check failed", err);
    return Response.json({ status: "unavailable", database: "error" }, { status: 503 });
  }
}
