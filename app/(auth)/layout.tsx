import Link from "next/link";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/shell/wordmark";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center px-4 py-12">
      <Link href="/" className="mb-8 rounded" aria-label="Plateau home">
        <Wordmark className="text-lg" />
      </Link>
      <main className="w-full max-w-sm rounded-lg border border-rule bg-panel p-6 shadow-sm">{children}</main>
    </div>
  );
}
