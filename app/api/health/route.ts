import { db, ready } from "@/db/client";
import { pingDatabase } from "@/db/queries/health";

export const dynamic = "force-dynamic";

export async function GET() {
  await ready();
  await pingDatabase(db);
  return Response.json({ ok: true });
}
