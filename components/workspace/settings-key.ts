import type { ScenarioSettings } from "@/lib/scaling";

/**
 * Short stable key of scenario settings (FNV-1a of their JSON): the results table and the sweep chart carry the key of
 * the settings they show, so tests (and people) can tell when both caught up. Server and browser compute the same key.
 */
export function keyOf(s: ScenarioSettings): string {
  const str = JSON.stringify(s);
  let h = 2166136261;
  for (let i = 0; i < str.length; i++) h = Math.imul(h ^ str.charCodeAt(i), 16777619);
  return (h >>> 0).toString(36);
}
