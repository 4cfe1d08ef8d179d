import { z } from "zod";
import { isMetalId, METALS, parseQuantity, TIERS, type BaseUnit, type Tier, type WireClass } from "@/lib/scaling/client";
import { mirrorOf } from "./mirror";
import { cleanText } from "./text";

/**
 * A physical quantity at the API edge: a number in SI base units (2e-8) or a string with an
 * SI-prefixed unit ("20 nm", "0.02 µm"), parsed exactly with decimal.js. The result is SI.
 */
export function quantity(
  label: string,
  unit: BaseUnit,
  limits: { min?: number; minExclusive?: boolean; max?: number; maxExclusive?: boolean; maxHint?: string; minHint?: string } = {},
) {
  return z.union([z.number(), z.string()], { error: `${label} must be a number${unit ? " with a unit" : ""}.` }).transform((v, ctx) => {
    let n: number;
    if (typeof v === "number") n = v;
    else {
      try {
        n = parseQuantity(v, unit);
      } catch {
        ctx.addIssue({
          code: "custom",
          message: unit ? `${label}: "${v}" is not a number with a known unit (for example ${EXAMPLE[unit] ?? "20 nm"}).` : `${label}: "${v}" is not a number.`,
        });
        return z.NEVER;
      }
    }
    if (!Number.isFinite(n)) {
      ctx.addIssue({ code: "custom", message: `${label} must be a finite number.` });
      return z.NEVER;
    }
    const { min, minExclusive, max, maxExclusive, maxHint, minHint } = limits;
    if (min !== undefined && (minExclusive ? n <= min : n < min)) {
      ctx.addIssue({
        code: "custom",
        message:
          minHint ??
          (minExclusive ? `${label} must be greater than ${min}.` : min === 0 ? `${label} must not be negative.` : `${label} must be at least ${min}.`),
      });
      return z.NEVER;
    }
    if (max !== undefined && (maxExclusive ? n >= max : n > max)) {
      ctx.addIssue({ code: "custom", message: maxHint ?? (maxExclusive ? `${label} must be less than ${max}.` : `${label} must be at most ${max}.`) });
      return z.NEVER;
    }
    return n;
  });
}

const EXAMPLE: Partial<Record<BaseUnit, string>> = {
  m: "20 nm",
  F: "1.5 fF",
  ohm: "2 kΩ",
  s: "10 ps",
  V: "0.75 V",
  Hz: "2 GHz",
  J: "1 fJ",
  W: "2 mW",
};

/** A length inside a wire's cross-section: > 0 and at most 100 µm (a larger value is a forgotten unit). */
const size = (label: string) =>
  quantity(label, "m", {
    min: 0,
    minExclusive: true,
    max: 100e-6,
    maxHint: `${label} must be at most 100 µm (did you forget a unit such as nm?).`,
  });
const optionalSize = (label: string) => size(label).nullable();

/** A metal id of the catalogue, exactly (own entries only: "constructor", "toString" or "__proto__" are not metals). */
export const metalIdSchema = z
  .string({ error: `Metal must be one of ${Object.keys(METALS).join(", ")}.` })
  .refine((m) => isMetalId(m), { message: `Metal must be one of ${Object.keys(METALS).join(", ")}.` });
export const tierSchema = z.enum(TIERS as [Tier, ...Tier[]], { error: `Tier must be one of ${TIERS.join(", ")}.` });
export const kSchema = quantity("k", "", {
  min: 1,
  minHint: "k must be at least 1 (vacuum); use an effective k for air gaps.",
  max: 30,
  maxHint: "k must be at most 30.",
});
/** Permittivity of an air gap between the lines: 1 (air) … 30; a class's also at most its k (checked with the class). */
export const airGapKSchema = quantity("Air-gap k", "", {
  min: 1,
  minHint: "Air-gap k must be at least 1 (air).",
  max: 30,
  maxHint: "Air-gap k must be at most 30.",
});
/** Share of the line thickness an air gap covers from the bottom of the lines, 0 … 1. */
export const gapFractionSchema = quantity("Gap fraction", "", {
  min: 0,
  minHint: "Gap fraction must be between 0 and 1.",
  max: 1,
  maxHint: "Gap fraction must be between 0 and 1.",
});
export const classNameSchema = cleanText(
  z
    .string({ error: "Class name is required." })
    .trim()
    .min(1, "Class name is required.")
    .max(60, "Class name must be at most 60 characters.")
    // classes are keys of the scenario's overrides: "__proto__" cannot be one (assigning it replaces the prototype)
    .refine((n) => n !== "__proto__", 'Class name "__proto__" is reserved.'),
  "Class name",
);

/**
 * One wire class as the API accepts it (SI numbers or strings with units): the engine's WireClass field for field,
 * without the histogram (imported separately) and with an optional `id` that keeps an existing row (and its histogram).
 */
export const wireClassSchema = mirrorOf<Omit<WireClass, "histogram"> & { id?: string }>()(
  z
    .object({
      id: z.string().max(64).optional(),
      name: classNameSchema,
      tier: tierSchema,
      widthM: size("Width"),
      thicknessM: size("Thickness"),
      spacingM: size("Spacing"),
      ildBelowM: optionalSize("ILD below"),
      ildAboveM: optionalSize("ILD above"),
      barrierM: quantity("Barrier", "m", { min: 0, max: 100e-6 }),
      metal: metalIdSchema,
      k: kSchema,
      netCount: z
        .number({ error: "Net count must be a number." })
        .int("Net count must be a whole number.")
        .min(0, "Net count must not be negative.")
        .max(1e12, "Net count is too large."),
      meanLengthM: quantity("Mean length", "m", { min: 0, minExclusive: true, max: 0.1, maxHint: "Mean length must be at most 100 mm." }),
      driverOhm: quantity("Driver resistance", "ohm", { min: 0, max: 1e9 }),
      loadF: quantity("Load", "F", { min: 0, max: 1e-9 }),
      activity: quantity("Activity", "", { min: 0, max: 1, maxHint: "Activity must be between 0 and 1." }),
      /** Vias in series with each net (engine 2; optional, absent = none). */
      viasPerNet: z
        .number({ error: "Vias per net must be a number." })
        .int("Vias per net must be a whole number.")
        .min(0, "Vias per net must not be negative.")
        .max(1e6, "Vias per net must be at most 1000000.")
        .optional(),
      viaOhm: quantity("Via resistance", "ohm", { min: 0, max: 1e9 }).optional(),
      viaWidthM: size("Via width").optional(),
      viaHeightM: size("Via height").optional(),
      /** Air gap between the lines (optional; both absent = none; kGap alone = that gap over the whole thickness, gapFraction alone = air). */
      kGap: airGapKSchema.optional(),
      gapFraction: gapFractionSchema.optional(),
    })
    .superRefine((c, ctx) => {
      if (c.ildBelowM === null && c.ildAboveM === null) {
        ctx.addIssue({ code: "custom", path: ["ildBelowM"], message: "Give at least one ILD height (a plane below or above)." });
      }
      if (2 * c.barrierM >= c.widthM) ctx.addIssue({ code: "custom", path: ["barrierM"], message: "Barrier must be less than half the width." });
      if (c.barrierM >= c.thicknessM) ctx.addIssue({ code: "custom", path: ["barrierM"], message: "Barrier must be less than the thickness." });
      if (c.kGap !== undefined && c.kGap > c.k) {
        ctx.addIssue({ code: "custom", path: ["kGap"], message: `Air-gap k must not exceed the class's k (${Number(c.k.toPrecision(6))}).` });
      }
    }),
);
export type WireClassInput = z.infer<typeof wireClassSchema>;

export const MAX_CLASSES = 200;

/** A list of classes: at most MAX_CLASSES, names unique (case-insensitive) with the message on the second use. */
export const wireClassListSchema = z
  .array(wireClassSchema, { error: "Classes must be a list." })
  .max(MAX_CLASSES, `A baseline holds at most ${MAX_CLASSES} classes.`)
  .superRefine((list, ctx) => {
    const seen = new Map<string, number>();
    const ids = new Set<string>();
    list.forEach((c, i) => {
      const key = c.name.toLowerCase();
      const first = seen.get(key);
      if (first !== undefined)
        ctx.addIssue({
          code: "custom",
          path: [i, "name"],
          message: `Class name "${c.name}" is used twice (rows ${first + 1} and ${i + 1}).`,
        });
      else seen.set(key, i);
      if (c.id) {
        if (ids.has(c.id)) ctx.addIssue({ code: "custom", path: [i, "id"], message: "The same class id appears twice." });
        ids.add(c.id);
      }
    });
  });
