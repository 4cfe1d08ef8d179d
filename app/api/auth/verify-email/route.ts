import { db } from "@/db/client";
import { verifyEmail } from "@/db/writes/users";
import { ApiError, apiRoute, conflict, readJson } from "@/lib/api";
import { hashVerificationToken } from "@/lib/email-verification";
import { verifyEmailSchema } from "@/lib/validation/auth";

const LINK_INVALID = "This confirmation link is not valid. Check that you copied the whole link, or send a new one after signing in.";

/** Confirm an e-mail address with the token from the link (no session needed: the token proves the address). */
export const POST = apiRoute(async (req) => {
  const { token } = await readJson(req, verifyEmailSchema, 4 * 1024);
  const r = await verifyEmail(db, { tokenHash: hashVerificationToken(token), now: Date.now() });
  if (r.status === "invalid") throw new ApiError(404, "not_found", LINK_INVALID);
  if (r.status === "used") throw conflict("This confirmation link has already been used. Your address was confirmed then.");
  if (r.status === "expired") {
    throw new ApiError(
      410,
      "link_expired",
      "This confirmation link has expired (links last 24 hours). Sign in and send a new one from the notice at the top of the page.",
    );
  }
  return Response.json({ verified: true, email: r.email });
});
