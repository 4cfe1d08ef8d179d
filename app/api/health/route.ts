import { db, ready } from "@/db/client";

export const dynamic = "force-dynamic";

export async function GET() {
  await ready();
  await db.raw("select 1");
  return Response.json({ ok: true });
}
