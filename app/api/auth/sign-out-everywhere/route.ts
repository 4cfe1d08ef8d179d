import { requireApiUser } from "@/lib/access";
import { apiRoute } from "@/lib/api";
import { clearSessionCookie, endAllSessions } from "@/lib/auth";

/** End every session of the signed-in user, this one included (a lost laptop, a shared computer). */
export const POST = apiRoute(async () => {
  const user = await requireApiUser();
  await endAllSessions(user.id);
  await clearSessionCookie();
  return Response.json({ ok: true });
});
