import { getMetal } from "@/lib/scaling";
import type { FrozenReport } from "@/lib/validation/report";

/**
 * A frozen report restricted to the classes it was composed for (`classNames`): the baseline's class table, each
 * option's per-class results, its per-class overrides and the materials block keep only what concerns those classes.
 * freezeReport stores documents already restricted (the engine then evaluates only the chosen classes, so totals,
 * worst class and flags are about them too); every read applies it again, so a report frozen before that rule shows
 * — on the team page, the print view and PDF, the CSV and above all behind a share link — only the classes it was
 * composed for. Issue 12 finding 12.
 */
export function scopeToChosenClasses(f: FrozenReport): FrozenReport {
  const chosen = new Set(f.classNames);
  const keep = <T>(record: Readonly<Record<string, T>>): Record<string, T> => Object.fromEntries(Object.entries(record).filter(([name]) => chosen.has(name)));
  const classes = f.baseline.classes.filter((c) => chosen.has(c.name));
  const options = f.options.map((o) => ({
    ...o,
    settings: { ...o.settings, overrides: keep(o.settings.overrides) },
    evaluation: { ...o.evaluation, classes: o.evaluation.classes.filter((c) => chosen.has(c.name)) },
  }));
  const roadmaps = f.roadmaps?.map((r) => ({
    ...r,
    steps: r.steps.map((st) => ({
      ...st,
      settings: st.settings.overrides ? { ...st.settings, overrides: keep(st.settings.overrides) } : st.settings,
      composed: { ...st.composed, overrides: keep(st.composed.overrides) },
      evaluation: { ...st.evaluation, classes: st.evaluation.classes.filter((c) => chosen.has(c.name)) },
    })),
  }));
  // metals the shown classes use: their own, the options' global fill and their overrides' fills
  const metals = new Set<string>(classes.map((c) => c.metal));
  for (const o of options) {
    if (o.settings.metal) metals.add(o.settings.metal);
    for (const ov of Object.values(o.settings.overrides)) if (ov.metal) metals.add(ov.metal);
    for (const c of o.evaluation.classes) metals.add(c.scenario.metal).add(c.baseline.metal);
  }
  for (const st of (roadmaps ?? []).flatMap((r) => r.steps)) for (const c of st.evaluation.classes) metals.add(c.scenario.metal);
  const { materials, ...technology } = f.baseline.technology;
  const metalId = (id: string) => {
    try {
      return getMetal(id).id; // the materials block may key a metal ignoring case
    } catch {
      return null;
    }
  };
  const shownMetals = new Set([...metals].map(metalId));
  const kept = materials ? Object.fromEntries(Object.entries(materials).filter(([id]) => shownMetals.has(metalId(id)))) : undefined;
  return {
    ...f,
    baseline: { ...f.baseline, technology: kept && Object.keys(kept).length > 0 ? { ...technology, materials: kept } : technology, classes },
    options,
    sweeps: f.sweeps.filter((s) => chosen.has(s.className)),
    ...(roadmaps ? { roadmaps } : {}),
  };
}
