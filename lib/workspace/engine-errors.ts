/**
 * The engine's input errors in the user's words and units (issue 13 item 7). The engine (lib/scaling) throws
 * RangeErrors with SI values and its own field names ("barrierM must be < widthM/2 … width 8.999997428572164e-9");
 * this module turns each kind the editor can meet into a sentence with nm and the settings words, and names the
 * fields to highlight (the dotted paths the scenario editor's field errors use). Pure: client and server.
 */
import Decimal from "decimal.js";

export interface ExplainedError {
  /** One or two sentences for the screen. */
  text: string;
  /** Field paths to mark, each with the message to show there. */
  fields: Record<string, string[]>;
}

const nm = (meters: string | number) => `${new Decimal(meters).div(1e-9).toSignificantDigits(3).toFixed()} nm`;
const num = (v: string | number) => new Decimal(v).toSignificantDigits(3).toFixed();

/** Engine parameter names as the editor labels them. */
const NAME: Record<string, { words: string; field?: string }> = {
  s: { words: "S (cross-section factor)", field: "settings.s" },
  sL: { words: "S_L (length factor)", field: "settings.sL" },
  miller: { words: "the Miller factor", field: "settings.miller" },
  k: { words: "the dielectric k", field: "settings.k" },
  deviceRFactor: { words: "Driver R ×", field: "settings.deviceRFactor" },
  deviceCFactor: { words: "Load C ×", field: "settings.deviceCFactor" },
  supplyV: { words: "the supply voltage", field: "settings.supplyV" },
  temperatureC: { words: "the operating temperature (°C)", field: "settings.temperatureC" },
  kGap: { words: "the air-gap k", field: "settings.airGap.kGap" },
  gapFraction: { words: "the gap fraction", field: "settings.airGap.gapFraction" },
};

/** What the editor shows for an engine error: explained where the kind is known, else the message as it came. */
export function explainEngineError(message: string, ctx: { s?: number; overrides?: Record<string, { s?: number }> } = {}): ExplainedError {
  // the barrier (kept at its thickness, or set per class) leaves no metal after scaling
  let m = /^barrierM must be < widthM\/2 and < thicknessM after scaling \(got barrier (\S+), width (\S+), thickness (\S+) in class (.+)\)$/.exec(message);
  if (m) {
    const [, bar, w, t, cls] = m as unknown as [string, string, string, string, string];
    const s = ctx.overrides?.[cls]?.s ?? ctx.s;
    const wHalf = new Decimal(w).div(2);
    const text =
      `Class ${cls}: the barrier (${nm(bar)} on each side) leaves no metal in a ${nm(w)} wide, ${nm(t)} thick line` +
      `${s !== undefined ? ` (the class's sizes ÷ S = ${num(s)})` : ""}. ` +
      `The barrier must be thinner than half the width (${nm(wHalf.toString())}) and than the thickness: let the barrier scale with S, give ${cls} a thinner barrier, or choose a smaller S.`;
    const short = `The ${nm(bar)} barrier leaves no metal in ${cls}'s ${nm(w)} line.`;
    return {
      text,
      fields: {
        [ctx.overrides?.[cls]?.s !== undefined ? `settings.overrides.${cls}.s` : "settings.s"]: [short],
        [`settings.overrides.${cls}.barrierM`]: [`Thinner than ${nm(wHalf.toString())} for this S.`],
      },
    };
  }
  m = /^(.+)\.viaWidthM must be > 2·barrierM after scaling \(got via width (\S+), barrier (\S+)\)$/.exec(message);
  if (m) {
    const [, cls, w, bar] = m as unknown as [string, string, string, string];
    const text = `Class ${cls}: its vias (${nm(w)} wide after scaling) are no wider than their barrier on both sides (2 × ${nm(bar)}); choose a smaller S or let the barrier scale with S.`;
    return { text, fields: { "settings.s": [`The vias of ${cls} have no metal left at this S.`] } };
  }
  m = /^(.+): the (delay|rc|r|c) is not finite/.exec(message);
  if (m) {
    const [, cls, what] = m as unknown as [string, string, string];
    const words = { delay: "delay", rc: "RC", r: "resistance", c: "capacitance" }[what] ?? what;
    return { text: `Class ${cls}: the ${words} cannot be computed with these sizes, length and driver (a value is far outside any real wire).`, fields: {} };
  }
  m = /^kGap must be >= 1 and <= k = (\S+) \(got (\S+)\)$/.exec(message);
  if (m) {
    const [, k, g] = m as unknown as [string, string, string];
    const text = `The air-gap k (${num(g)}) must be at least 1 (air) and at most the class's k (${num(k)}).`;
    return { text, fields: { "settings.airGap.kGap": [text] } };
  }
  m = /^(\w+) must be (> 0|>= 0|between (\S+) and (\S+)|>= (\S+)) \(got (\S+)\)$/.exec(message);
  if (m && NAME[m[1]!]) {
    const n = NAME[m[1]!]!;
    const rule = m[2]!.startsWith("between")
      ? `between ${m[3]} and ${m[4]}`
      : m[2] === "> 0"
        ? "greater than 0"
        : m[2] === ">= 0"
          ? "0 or more"
          : `at least ${m[5]}`;
    const text = `${n.words.charAt(0).toUpperCase()}${n.words.slice(1)} must be ${rule} (it is ${num(m[6]!)}).`;
    return { text, fields: n.field ? { [n.field]: [text] } : {} };
  }
  return { text: message, fields: {} };
}
