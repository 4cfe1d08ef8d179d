import type { ReactNode } from "react";

export function Card({ title, actions, children, className = "" }: { title?: ReactNode; actions?: ReactNode; children: ReactNode; className?: string }) {
  return (
    <section className={`rounded-lg border border-rule bg-panel ${className}`}>
      {title || actions ? (
        <header className="flex items-center justify-between gap-3 border-b border-rule px-4 py-2.5">
          {title ? <h2 className="text-sm font-semibold text-ink">{title}</h2> : <span />}
          {actions}
        </header>
      ) : null}
      <div className="p-4">{children}</div>
    </section>
  );
}

/** What to do next when a list is empty: one sentence and, usually, one action. */
export function EmptyState({ title, children, action }: { title: ReactNode; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-rule-strong bg-panel/60 px-6 py-8 text-center">
      <p className="font-medium text-ink">{title}</p>
      {children ? <div className="mx-auto mt-1 max-w-prose text-sm text-muted">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}

export function Badge({ tone = "neutral", children }: { tone?: "neutral" | "copper" | "good" | "bad" | "warn"; children: ReactNode }) {
  const tones = {
    neutral: "bg-rule/60 text-ink",
    copper: "bg-copper-soft text-copper-dark",
    good: "bg-good-soft text-good",
    bad: "bg-bad-soft text-bad",
    warn: "bg-warn-soft text-warn",
  } as const;
  return <span className={`inline-flex items-center rounded px-1.5 py-0.5 text-xs font-medium ${tones[tone]}`}>{children}</span>;
}

/** Alert box for form-level messages and notices. */
export function Notice({ tone = "neutral", children, role }: { tone?: "neutral" | "good" | "bad" | "warn"; children: ReactNode; role?: "alert" | "status" }) {
  const tones = {
    neutral: "border-rule bg-panel text-ink",
    good: "border-good/30 bg-good-soft text-good",
    bad: "border-bad/30 bg-bad-soft text-bad",
    warn: "border-warn/30 bg-warn-soft text-warn",
  } as const;
  return (
    <div role={role ?? (tone === "bad" ? "alert" : "status")} className={`rounded-md border px-3 py-2 text-sm ${tones[tone]}`}>
      {children}
    </div>
  );
}
