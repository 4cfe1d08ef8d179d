import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { cache } from "react";
import { db } from "@/db/client";
import { getBaseline } from "@/db/queries/baselines";
import { getRoadmap, listRoadmaps } from "@/db/queries/roadmaps";
import { listScenarios } from "@/db/queries/scenarios";
import { listClassesWithHistograms } from "@/db/queries/wire-classes";
import { RoadmapEditor } from "@/components/workspace/roadmap-editor";
import { coarsenHistogram, type WireClass } from "@/lib/scaling";
import { roadmapResults } from "@/lib/workspace/roadmap-evaluate";
import { CHART_LEVELS } from "@/lib/workspace/roadmap-view";
import { getTeamContext } from "@/lib/team-context";

// Metadata and page share one read per request.
const loadRoadmap = cache((id: string) => getRoadmap(db, id));

export async function generateMetadata({ params }: { params: Promise<{ teamId: string; roadmapId: string }> }): Promise<Metadata> {
  const { teamId, roadmapId } = await params;
  await getTeamContext(teamId);
  const r = await loadRoadmap(roadmapId);
  return { title: r && r.teamId === teamId ? `${r.name} · Roadmap` : "Roadmap" };
}

export default async function RoadmapPage({ params }: { params: Promise<{ teamId: string; roadmapId: string }> }) {
  const { teamId, roadmapId } = await params;
  const ctx = await getTeamContext(teamId);
  const roadmap = await loadRoadmap(roadmapId);
  if (!roadmap || roadmap.teamId !== teamId) notFound();
  const baseline = (await getBaseline(db, roadmap.baselineId))!;
  const [stored, scenarios, others] = await Promise.all([
    listClassesWithHistograms(db, baseline.id),
    listScenarios(db, teamId, baseline.id),
    listRoadmaps(db, teamId, baseline.id),
  ]);
  // The engine's classes as the scenario editor evaluates them (coarsened histograms); the browser's worker takes over.
  const classes = stored.map(({ id: _i, position: _p, histogramBins: _h, ...c }): WireClass =>
    c.histogram ? { ...c, histogram: coarsenHistogram(c.histogram) } : c,
  );
  const initialResults = roadmapResults({
    classes,
    technology: baseline.technology,
    chains: [{ key: "main", steps: roadmap.steps }],
    levels: [...CHART_LEVELS],
  });
  return (
    <RoadmapEditor
      teamId={teamId}
      userId={ctx.user.id}
      role={ctx.role}
      initialRoadmap={roadmap}
      baseline={{ id: baseline.id, name: baseline.name, isDemo: baseline.isDemo, technology: baseline.technology }}
      classes={classes}
      scenarios={scenarios.map((s) => ({ id: s.id, name: s.name }))}
      branches={others.filter((o) => o.id !== roadmap.id).map((o) => ({ id: o.id, name: o.name, steps: o.steps }))}
      initialResults={initialResults}
    />
  );
}
