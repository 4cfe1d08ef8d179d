import type { NextConfig } from "next";
import { securityHeaders } from "./lib/security-headers";

const nextConfig: NextConfig = {
  // knex would otherwise be bundled and fail looking for drivers we never use.
  serverExternalPackages: ["knex", "better-sqlite3", "playwright-core", "smtp-server", "nodemailer"],
  poweredByHeader: false,
  // API answers' security headers (issue 12, finding 4; the pages' come from proxy.ts). Set here rather than in the
  // proxy because a proxy makes Next buffer every request body for it (up to 10 MB), which would stall and cut the
  // streamed CSV imports; they are the same for every answer, and apiRoute adds HSTS at run time (lib/api.ts). The
  // build's static files (scripts, styles, fonts, worker scripts) get nosniff.
  async headers() {
    const list = (h: Record<string, string>) => Object.entries(h).map(([key, value]) => ({ key, value }));
    return [
      { source: "/_next/static/:path*", headers: [{ key: "x-content-type-options", value: "nosniff" }] },
      { source: "/api/:path*", headers: list(securityHeaders({ kind: "api", dev: false, https: false })) },
      { source: "/api/share/:path*", headers: [{ key: "referrer-policy", value: "no-referrer" }] },
    ];
  },
  // Separate build folders let parallel test runs (and developers) build without clobbering each other.
  distDir: process.env.PLATEAU_DIST_DIR || ".next",
  // Types are checked by `npm test` (tsc --noEmit) before the suite runs, once for the whole tree.
  typescript: { ignoreBuildErrors: true },
  // A worktree whose node_modules is a symlink into another checkout builds with PLATEAU_TURBOPACK_ROOT set to a folder
  // holding both (Turbopack resolves nothing outside its root).
  ...(process.env.PLATEAU_TURBOPACK_ROOT ? { turbopack: { root: process.env.PLATEAU_TURBOPACK_ROOT } } : {}),
};

export default nextConfig;
