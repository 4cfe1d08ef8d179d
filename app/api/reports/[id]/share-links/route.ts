import { db } from "@/db/client";
import { reportTeamId } from "@/db/queries/reports";
import { listShareLinks } from "@/db/queries/share-links";
import { createShareLink } from "@/db/writes/share-links";
import { requireResourceRole } from "@/lib/access";
import { apiRoute, readJson } from "@/lib/api";
import { shareUrl } from "@/lib/reports/service";
import { createShareLinkSchema } from "@/lib/validation/report";

export const dynamic = "force-dynamic";

/** The report's share links (never their tokens). Editor and up. */
export const GET = apiRoute<{ id: string }>(async (_req, { id }) => {
  await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  return Response.json({ links: await listShareLinks(db, id) });
});

/** A new read-only link; the URL (with its token) is in this answer only. Editor and up. */
export const POST = apiRoute<{ id: string }>(async (req, { id }) => {
  const { user, teamId } = await requireResourceRole(() => reportTeamId(db, id), "editor", "Report");
  const hasBody = req.headers.get("content-type") !== null;
  const input = hasBody ? await readJson(req, createShareLinkSchema, 4 * 1024) : createShareLinkSchema.parse(undefined);
  const { link, token } = await createShareLink(db, { reportId: id, teamId, userId: user.id, expiresInDays: input.expiresInDays });
  return Response.json({ link, url: shareUrl(token) }, { status: 201 });
});
