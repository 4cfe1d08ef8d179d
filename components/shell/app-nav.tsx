"use client";
import Link from "next/link";
import { useParams, usePathname } from "next/navigation";
import { useEffect, useRef, useState, type ReactNode } from "react";
import type { TeamWithRole } from "@/db/queries/teams";

/** What the team switcher shows of each of the user's teams. */
export type NavTeam = Pick<TeamWithRole, "id" | "name" | "role" | "isDemo">;

const SECTIONS = [
  { label: "Home", path: "" },
  { label: "Baselines", path: "/baselines" },
  { label: "Scenarios", path: "/scenarios" },
  { label: "Roadmaps", path: "/roadmaps" },
  { label: "Reports", path: "/reports" },
  { label: "Settings", path: "/settings" },
] as const;

/** A small disclosure menu: closes on navigation, on Escape and on a click outside. */
function Menu({ label, buttonLabel, children, align = "left" }: { label: string; buttonLabel: ReactNode; children: ReactNode; align?: "left" | "right" }) {
  const [open, setOpen] = useState(false);
  const ref = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  // Navigation closes the menu (adjusted while rendering, not in an effect).
  const pathname = usePathname();
  const [shownOn, setShownOn] = useState(pathname);
  if (shownOn !== pathname) {
    setShownOn(pathname);
    setOpen(false);
  }
  useEffect(() => {
    if (!open) return;
    // Escape closes and gives focus back to the button (focus inside the menu would otherwise drop to the page body)
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== "Escape") return;
      setOpen(false);
      buttonRef.current?.focus();
    };
    const onClick = (e: MouseEvent) => ref.current && !ref.current.contains(e.target as Node) && setOpen(false);
    document.addEventListener("keydown", onKey);
    document.addEventListener("mousedown", onClick);
    return () => {
      document.removeEventListener("keydown", onKey);
      document.removeEventListener("mousedown", onClick);
    };
  }, [open]);
  return (
    <div ref={ref} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="true"
        aria-expanded={open}
        aria-label={label}
        onClick={() => setOpen((o) => !o)}
        className="inline-flex items-center gap-1.5 rounded-md px-2 py-1 text-sm text-ink hover:bg-rule/50"
      >
        {buttonLabel}
        <svg width="10" height="10" viewBox="0 0 10 10" aria-hidden="true">
          <path d="M2 3.5l3 3 3-3" fill="none" stroke="currentColor" strokeWidth="1.4" />
        </svg>
      </button>
      {open ? (
        <div className={`absolute z-30 mt-1 min-w-56 rounded-md border border-rule bg-panel py-1 shadow-md ${align === "right" ? "right-0" : "left-0"}`}>
          {children}
        </div>
      ) : null}
    </div>
  );
}

const itemClass = "block w-full px-3 py-1.5 text-left text-sm text-ink hover:bg-ground focus:bg-ground";

export function TeamSwitcher({ teams }: { teams: NavTeam[] }) {
  const params = useParams<{ teamId?: string }>();
  const current = teams.find((t) => t.id === params.teamId);
  return (
    <Menu label="Switch team" buttonLabel={<span className="max-w-48 truncate">{current ? current.name : "Teams"}</span>}>
      {teams.map((t) => (
        <Link key={t.id} href={`/teams/${t.id}`} className={itemClass} aria-current={t.id === current?.id ? "true" : undefined}>
          <span className={t.id === current?.id ? "font-semibold" : ""}>{t.name}</span>
          <span className="ml-2 text-xs text-muted">{t.role}</span>
        </Link>
      ))}
      <div className="my-1 border-t border-rule" />
      <Link href="/teams" className={itemClass}>
        All teams / new team
      </Link>
    </Menu>
  );
}

export function SectionNav() {
  const params = useParams<{ teamId?: string }>();
  const pathname = usePathname();
  if (!params.teamId) return null;
  const base = `/teams/${params.teamId}`;
  return (
    <nav
      aria-label="Team sections"
      className="order-last -mx-1 flex w-full items-center gap-0.5 overflow-x-auto px-1 sm:order-none sm:mx-0 sm:w-auto sm:gap-1 sm:overflow-visible sm:px-0"
    >
      {SECTIONS.map((s) => {
        const href = base + s.path;
        const active = s.path === "" ? pathname === base : pathname === href || pathname.startsWith(href + "/");
        return (
          <Link
            key={s.label}
            href={href}
            aria-current={active ? "page" : undefined}
            className={`shrink-0 rounded-md px-2 py-1 text-sm sm:px-2.5 ${active ? "bg-copper-soft font-medium text-copper-dark" : "text-muted hover:bg-rule/50 hover:text-ink"}`}
          >
            {s.label}
          </Link>
        );
      })}
    </nav>
  );
}

export function AccountMenu({ name, email, showOutbox, signOut }: { name: string; email: string; showOutbox: boolean; signOut: () => Promise<void> }) {
  return (
    <Menu label="Account" align="right" buttonLabel={<span className="max-w-40 truncate">{name}</span>}>
      <div className="border-b border-rule px-3 py-2">
        <p className="text-sm font-medium text-ink">{name}</p>
        <p className="text-xs text-muted">{email}</p>
      </div>
      <Link href="/teams" className={itemClass}>
        Your teams
      </Link>
      <Link href="/account" className={itemClass}>
        Account and password
      </Link>
      {showOutbox ? (
        <Link href="/dev/outbox" className={itemClass}>
          Outbox (sent mail)
        </Link>
      ) : null}
      <form action={signOut}>
        <button type="submit" className={itemClass}>
          Sign out
        </button>
      </form>
    </Menu>
  );
}
