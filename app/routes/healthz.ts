import { sql } from "kysely";
import { db } from "~/.server/platform/db.server";

export async function loader() {
  await sql`SELECT 1`.execute(db);
  return Response.json({ ok: true });
}
