// The evaluating half of the engine on the browser's main thread, for the scenario editor's live evaluation
// (use-evaluation.ts). Loaded ONLY by dynamic import, in idle time after the first paint: it carries the capacitance
// and delay tables, which must stay out of first-load JS. Evaluating on the main thread lets a slider step show its
// results in the same frame as the thumb (a Web Worker's answer always lands a frame later; issue 13, item 14).
// Sweeps and the field check stay in the Web Worker (engine-worker.ts).
export { evaluateScenario } from "@/lib/scaling";
