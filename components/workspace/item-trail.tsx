import Link from "next/link";
import { Badge } from "@/components/ui/card";

/**
 * The line above a scenario's or a roadmap's name: back to its list, the baseline it is evaluated on, the class count,
 * the stored version, and the demo badge.
 */
export function ItemTrail(p: {
  teamId: string;
  list: { segment: "scenarios" | "roadmaps"; label: string };
  baseline: { id: string; name: string; isDemo: boolean };
  classCount: number;
  version: number;
  isDemo: boolean;
}) {
  return (
    <p className="text-xs text-muted">
      <Link href={`/teams/${p.teamId}/${p.list.segment}`} className="hover:underline">
        {p.list.label}
      </Link>{" "}
      · on baseline{" "}
      <Link href={`/teams/${p.teamId}/baselines/${p.baseline.id}`} className="font-medium text-ink hover:underline">
        {p.baseline.name}
      </Link>{" "}
      · {p.classCount} classes · version {p.version}
      {p.isDemo || p.baseline.isDemo ? (
        <>
          {" "}
          · <Badge tone="warn">invented demo data</Badge>
        </>
      ) : null}
    </p>
  );
}
