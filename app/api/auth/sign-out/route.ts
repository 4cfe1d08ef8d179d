import { apiRoute } from "@/lib/api";
import { endSession } from "@/lib/auth";

export const POST = apiRoute(async () => {
  await endSession();
  return Response.json({ ok: true });
});
