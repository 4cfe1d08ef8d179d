import { db, ready } from "@/db/client";
import { resolveShareToken } from "@/db/queries/share-links";

export const dynamic = "force-dynamic";

// A page cannot answer 410 in the App Router, so the link's own address is a route handler: it answers
// 404 / 410 itself and sends a valid link on to the report page under it.
function page(req: Request, status: number, title: string, text: string): Response {
  // The page's CSP (proxy.ts) admits only <style> carrying this request's nonce.
  const nonce = req.headers.get("x-nonce");
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1">
<meta name="robots" content="noindex"><title>${title} · Plateau</title>
<style${nonce ? ` nonce="${nonce}"` : ""}>body{margin:0;background:#f6f5f2;color:#1d1f22;font:15px/1.5 ui-sans-serif,system-ui,sans-serif}
main{max-width:34rem;margin:12vh auto;padding:1.5rem 1.75rem;background:#fff;border:1px solid #dedbd4;border-radius:8px}
h1{font-size:1.15rem;margin:0 0 .5rem}p{margin:.25rem 0;color:#5f6368}.mark{color:#b4622d;font-weight:600;letter-spacing:.02em}</style></head>
<body><main><p class="mark">Plateau</p><h1>${title}</h1><p>${text}</p></main></body></html>`;
  return new Response(html, {
    status,
    headers: {
      "content-type": "text/html; charset=utf-8",
      "cache-control": "no-store",
      "referrer-policy": "no-referrer",
      "x-robots-tag": "noindex",
    },
  });
}

export async function GET(req: Request, ctx: { params: Promise<{ token: string }> }): Promise<Response> {
  const { token } = await ctx.params;
  await ready();
  const r = await resolveShareToken(db, token);
  if (r.status === "expired") {
    return page(req, 410, "This share link has expired", "The report behind this link is no longer shared. Ask the person who sent it for a new link.");
  }
  if (r.status === "missing") {
    return page(
      req,
      404,
      "No report at this address",
      "This link is not valid: it may have been revoked, or mistyped. Ask the person who sent it for a new link.",
    );
  }
  return new Response(null, {
    status: 303,
    headers: { location: `/r/${encodeURIComponent(token)}/report`, "cache-control": "no-store", "referrer-policy": "no-referrer" },
  });
}
