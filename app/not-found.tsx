import Link from "next/link";
import { Wordmark } from "@/components/shell/wordmark";

export default function NotFound() {
  return (
    <main className="mx-auto max-w-lg px-4 py-16">
      <Link href="/" aria-label="Plateau home" className="rounded">
        <Wordmark />
      </Link>
      <h1 className="mt-8 text-xl font-semibold text-ink">Not found</h1>
      <p className="mt-2 text-sm text-muted">
        There is nothing here, or it belongs to a team you are not a member of. Check the link, or ask the team&apos;s owner to invite you.
      </p>
      <Link href="/teams" className="mt-6 inline-block rounded-md bg-copper px-3 py-1.5 text-sm font-medium text-white hover:bg-copper-dark">
        Your teams
      </Link>
    </main>
  );
}
