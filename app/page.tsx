import Link from "next/link";
import { db } from "@/db/client";
import { listTeamsOfUser } from "@/db/queries/teams";
import { Wordmark } from "@/components/shell/wordmark";
import { ButtonLink } from "@/components/ui/button";
import { Caution } from "@/components/caution";
import { validateRequest } from "@/lib/auth";

export const dynamic = "force-dynamic";

/**
 * Plateau's motif: a cross-section of three wiring tiers (narrow local wires at the bottom, wide
 * global wires on top, dielectric between) beside a delay curve that falls and then levels off.
 */
function CrossSection() {
  const tiers = [
    { y: 150, w: 14, h: 22, gap: 12, n: 9 },
    { y: 98, w: 22, h: 34, gap: 18, n: 6 },
    { y: 28, w: 42, h: 52, gap: 26, n: 3 },
  ];
  return (
    <svg viewBox="0 0 460 200" role="img" aria-labelledby="motif-title" className="h-auto w-full max-w-xl">
      <title id="motif-title">Wire cross-section in three tiers beside a delay curve that levels off</title>
      <rect x="0" y="0" width="240" height="200" rx="6" fill="#efece6" />
      {tiers.map((t, i) =>
        Array.from({ length: t.n }, (_, k) => {
          const total = t.n * t.w + (t.n - 1) * t.gap;
          const x0 = (240 - total) / 2;
          return <rect key={`${i}-${k}`} x={x0 + k * (t.w + t.gap)} y={t.y} width={t.w} height={t.h} rx="1.5" fill="#b4622d" opacity={0.7 + i * 0.15} />;
        }),
      )}
      <line x1="10" y1="186" x2="230" y2="186" stroke="#c4c0b6" strokeWidth="6" />
      <g transform="translate(268 20)">
        <line x1="0" y1="160" x2="180" y2="160" stroke="#5f6368" strokeWidth="1" />
        <line x1="0" y1="0" x2="0" y2="160" stroke="#5f6368" strokeWidth="1" />
        <path d="M6 18 C 40 90, 70 128, 110 134 S 160 136, 176 136" fill="none" stroke="#b4622d" strokeWidth="2.5" />
        <path d="M6 18 C 40 95, 80 150, 176 156" fill="none" stroke="#8a8f96" strokeWidth="1.5" strokeDasharray="4 4" />
        <text x="90" y="178" textAnchor="middle" fontSize="11" fill="#5f6368">
          scale factor S
        </text>
        <text x="-80" y="-8" transform="rotate(-90)" textAnchor="middle" fontSize="11" fill="#5f6368">
          delay
        </text>
      </g>
    </svg>
  );
}

export default async function LandingPage() {
  const { user } = await validateRequest();
  const teams = user ? await listTeamsOfUser(db, user.id) : [];
  const first = teams[0];
  return (
    <div className="min-h-screen">
      <header className="mx-auto flex max-w-5xl items-center justify-between px-4 py-4">
        <Wordmark className="text-lg" />
        <nav aria-label="Account" className="flex items-center gap-2">
          {user ? (
            <ButtonLink href={first ? `/teams/${first.id}` : "/teams"}>{first ? `Open ${first.name}` : "Your teams"}</ButtonLink>
          ) : (
            <>
              <ButtonLink variant="ghost" href="/sign-in">
                Sign in
              </ButtonLink>
              <ButtonLink href="/sign-up">Create account</ButtonLink>
            </>
          )}
        </nav>
      </header>
      <main className="mx-auto grid max-w-5xl items-center gap-10 px-4 py-12 md:grid-cols-2">
        <div>
          <h1 className="text-3xl font-semibold tracking-tight text-ink">Plan on-chip wiring across process nodes.</h1>
          <p className="mt-4 text-base leading-relaxed text-muted">
            Plateau is where back-end-of-line architects, DTCO engineers and physical-design leads keep a design&apos;s wire classes as a shared baseline, try
            what-if scenarios of cross-section and length scaling, dielectric, metal and barrier, and see each class&apos;s resistance, capacitance, RC delay,
            repeaters and switching energy — including where delay stops improving as wires shrink — then hand managers a frozen side-by-side report.
          </p>
          <div className="mt-6 flex flex-wrap gap-2">
            {user ? (
              <ButtonLink href={first ? `/teams/${first.id}` : "/teams"}>{first ? `Go to ${first.name}` : "Create your first team"}</ButtonLink>
            ) : (
              <>
                <ButtonLink href="/sign-up">Create an account</ButtonLink>
                <ButtonLink variant="secondary" href="/sign-in">
                  Sign in
                </ButtonLink>
              </>
            )}
          </div>
          {user ? (
            <p className="mt-3 text-sm text-muted">
              Signed in as {user.email}.{" "}
              {teams.length > 1 ? (
                <Link href="/teams" className="text-copper-dark underline">
                  All {teams.length} teams
                </Link>
              ) : null}
            </p>
          ) : null}
        </div>
        <CrossSection />
      </main>
      <footer className="mx-auto max-w-5xl px-4 pb-10">
        <Caution />
      </footer>
    </div>
  );
}
