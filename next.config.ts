import type { NextConfig } from "next";

const nextConfig: NextConfig = {
  // knex would otherwise be bundled and fail looking for drivers we never use.
  serverExternalPackages: ["knex", "better-sqlite3", "playwright-core", "smtp-server", "nodemailer"],
  poweredByHeader: false,
  // The build's static files (scripts, styles, fonts, worker scripts) skip proxy.ts, which sets every other answer's
  // security headers; they get nosniff here.
  async headers() {
    return [{ source: "/_next/static/:path*", headers: [{ key: "X-Content-Type-Options", value: "nosniff" }] }];
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
