import { requireApiUser } from "@/lib/access";
import { apiRoute, conflict } from "@/lib/api";
import { sendVerificationLink } from "@/lib/email-verification";

/** Mail the signed-in user a new confirmation link (paced: 429 with Retry-After). */
export const POST = apiRoute(async (_req) => {
  const user = await requireApiUser();
  if (user.emailVerified) throw conflict("Your e-mail address is already confirmed.");
  const mail = await sendVerificationLink(user);
  return Response.json({ mail: { status: mail.status } });
});
