import { sql } from "kysely";
import { db } from "~/.server/db.server";

export async function loader() {
  await sql`SELECT 1`.execute(db);
  return Response.json({ ok: true });
}
