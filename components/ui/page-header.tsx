import type { ReactNode } from "react";

/** A page's title and, below it, one short paragraph saying what the page is for (`className` adds to the paragraph's). */
export function PageHeader({ title, children, className = "" }: { title: ReactNode; children?: ReactNode; className?: string }) {
  return (
    <div>
      <h1 className="text-xl font-semibold text-ink">{title}</h1>
      {children ? <p className={`text-sm text-muted ${className}`.trim()}>{children}</p> : null}
    </div>
  );
}
