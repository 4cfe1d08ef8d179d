import Link from "next/link";
import { Badge } from "@/components/ui/card";

/** The baselines' and scenarios' list rows: the same row look, name cell and "last change" cell. */
export const listRowClass = "border-b border-rule/60 last:border-0 hover:bg-ground/60";

export function NameCell({ href, name, isDemo, note }: { href: string; name: string; isDemo: boolean; note: string }) {
  return (
    <td className="px-3 py-2">
      <Link href={href} className="font-medium text-copper-dark hover:underline">
        {name}
      </Link>{" "}
      {isDemo ? <Badge tone="warn">invented</Badge> : null}
      {note ? <p className="line-clamp-1 text-xs text-muted">{note}</p> : null}
    </td>
  );
}

export function LastChangeCell({ at, by }: { at: number; by: string | null }) {
  return (
    <td className="px-3 py-2 text-xs text-muted">
      {new Date(at).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" })}
      {by ? ` · ${by}` : ""}
    </td>
  );
}
