/**
 * Freezes a report's "Layer shaping" section: for each option (scenario) and each chosen class (the first
 * MAX_SHAPING_CLASSES), the fixed-pitch optimum of the chosen objective against the current drawing, the delay's parts
 * and the top five tornado inputs, through the same computation as the screen (lib/workspace/shaping.ts, without the
 * heat map). A class whose limits leave no geometry is stored with its message instead of figures.
 */
import type { DesignObjective, ScenarioSettings, Technology, WireClass } from "@/lib/scaling";
import { shapeClass } from "@/lib/workspace/shaping";
import { DEFAULT_SHAPING_LIMITS, explainShapingError } from "@/lib/workspace/shaping-view";
import type { FrozenShaping, FrozenShapingClass } from "@/lib/validation/report-shaping";

/** Classes shaped per report (each costs one optimiser run per option, ≈ 20–40 ms on the server: `npm run bench`). */
export const MAX_SHAPING_CLASSES = 12;

export function freezeShaping(p: {
  classes: WireClass[];
  technology: Technology;
  options: { key: string; settings: ScenarioSettings }[];
  classNames: string[];
  objective: DesignObjective;
}): FrozenShaping {
  const shaped = p.classNames.slice(0, MAX_SHAPING_CLASSES);
  const limits = DEFAULT_SHAPING_LIMITS;
  return {
    objective: p.objective,
    limits: { ...limits },
    options: p.options.map((o) => ({
      key: o.key,
      classes: shaped.map((className): FrozenShapingClass => {
        try {
          const r = shapeClass({ classes: p.classes, technology: p.technology, settings: o.settings, className, objective: p.objective, limits, gridSize: 0 });
          const lite = (d: typeof r.current) => ({
            widthM: d.widthM,
            spacingM: d.spacingM,
            thicknessM: d.thicknessM,
            lineFraction: d.lineFraction,
            aspectRatio: d.aspectRatio,
            objectiveValue: d.objectiveValue,
            delayS: d.delayS,
            energyJ: d.energyJ,
            repeaters: d.repeaters,
            flags: d.flags.map((f) => f.message),
          });
          const { driverWireS, driverLoadS, wireWireS, wireLoadS, repeatersS, totalS } = r.parts;
          return {
            className,
            current: lite(r.current),
            optimum: lite(r.optimum),
            parts: { driverWireS, driverLoadS, wireWireS, wireLoadS, repeatersS, totalS },
            tornado: {
              nominalS: r.tornado.nominalS,
              step: r.tornado.step,
              top: r.tornado.bars.slice(0, 5).map((b) => ({ input: b.input, deltaLowS: b.deltaLowS, deltaHighS: b.deltaHighS })),
            },
          };
        } catch (e) {
          if (!(e instanceof RangeError)) throw e;
          return { className, error: explainShapingError(e.message) ?? e.message };
        }
      }),
    })),
    omittedClasses: p.classNames.slice(MAX_SHAPING_CLASSES),
  };
}
