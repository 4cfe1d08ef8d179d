/** The product's standing caution, shown on every result screen and report. */
export const CAUTION_TEXT =
  "First-order planning estimates from published closed-form models and tables of our own 2D field solver, accurate to their stated bands inside their validity ranges (flags show when an input leaves one). They are no substitute for foundry-qualified extraction, timing sign-off or reliability (electromigration, TDDB) rules; defer to the foundry's rules and licensed practice.";

export function Caution({ className = "" }: { className?: string }) {
  return (
    <aside aria-label="Caution" className={`rounded-md border border-warn/30 bg-warn-soft px-3 py-2 text-xs leading-relaxed text-warn ${className}`}>
      <strong className="font-semibold">Caution. </strong>
      {CAUTION_TEXT}
    </aside>
  );
}
