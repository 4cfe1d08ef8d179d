/** What an editor page (scenario, roadmap) shows while it loads: a title bar over a settings column and a results area. */
export function EditorSkeleton({ label }: { label: string }) {
  return (
    <div className="space-y-4" aria-busy="true" aria-label={label}>
      <div className="h-8 w-72 animate-pulse rounded bg-rule/60" />
      <div className="grid gap-4 lg:grid-cols-[19rem_1fr]">
        <div className="h-96 animate-pulse rounded-lg bg-rule/40" />
        <div className="h-96 animate-pulse rounded-lg bg-rule/40" />
      </div>
    </div>
  );
}
