import { evaluateRoadmap, type ModelLevel, type RoadmapStep, type Technology, type WireClass } from "@/lib/scaling";

/** A roadmap evaluated by the engine (evaluateRoadmap's answer). */
export type RoadmapEvaluation = ReturnType<typeof evaluateRoadmap>;
/** Per chain: its evaluation at each level asked for, or the engine's message when the chain does not compose. */
export type RoadmapResults = { key: string; byLevel: Partial<Record<ModelLevel, RoadmapEvaluation>>; error?: string }[];

export interface RoadmapArgs {
  classes: WireClass[];
  technology: Technology;
  chains: { key: string; steps: RoadmapStep[] }[];
  levels: ModelLevel[];
}

/**
 * Every chain (the roadmap on screen and its branches) at every level asked for: evaluateRoadmap with the level set
 * on the first step and left out of the later ones (options carry forward, so every step is at that level). Runs in
 * the engine worker (live edits) and on the server (the page's first results).
 */
export function roadmapResults(args: RoadmapArgs): RoadmapResults {
  return args.chains.map((chain) => {
    const byLevel: Partial<Record<ModelLevel, RoadmapEvaluation>> = {};
    try {
      for (const level of args.levels) {
        const steps = chain.steps.map((st, i) => {
          const { level: _l, ...settings } = st.settings;
          return { ...st, settings: i === 0 ? { ...settings, level } : settings };
        });
        byLevel[level] = evaluateRoadmap({ classes: args.classes, technology: args.technology, steps });
      }
      return { key: chain.key, byLevel };
    } catch (e) {
      return { key: chain.key, byLevel: {}, error: e instanceof Error ? e.message : String(e) };
    }
  });
}
