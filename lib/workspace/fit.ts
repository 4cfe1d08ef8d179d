import "server-only";
import { badRequest } from "@/lib/api";
import { FitInputError, fitSizeEffect, formatScaled, type SizeEffectFit, type Technology, type WireClass } from "@/lib/scaling";
import type { FitRequest } from "@/lib/validation/baseline";

const FIELD: Record<FitInputError["field"], string> = { className: "class", rOhmPerM: "rOhmPerUm", temperatureC: "temperatureC" };

/**
 * Fits the size-effect parameters to the measured lines (fitSizeEffect) on the baseline's stored classes.
 * A point the engine cannot use is a 400 naming the row and field (`measured.<i>.<field>`), with the bound it broke.
 */
export function runFit(p: { classes: WireClass[]; storedTechnology: Technology; request: FitRequest }): SizeEffectFit {
  const technology = p.request.technology ?? p.storedTechnology;
  try {
    return fitSizeEffect({
      classes: p.classes,
      technology,
      measured: p.request.measured.map((m) => ({
        className: m.class,
        rOhmPerM: m.rOhmPerUm * 1e6,
        ...(m.temperatureC !== undefined ? { temperatureC: m.temperatureC } : {}),
      })),
    });
  } catch (e) {
    if (!(e instanceof FitInputError)) throw e;
    const m = p.request.measured[e.index]!;
    const row = `Row ${e.index + 1} (class ${m.class})`;
    let message: string;
    if (e.field === "className") message = `${row}: no class of this baseline is named "${m.class}".`;
    else if (e.field === "temperatureC") message = `${row}: the measurement temperature must be above −273.15 °C and at most 400 °C.`;
    else if (e.bulkOhmPerM !== undefined)
      message =
        `${row}: ${m.rOhmPerUm} Ω/µm is below the bulk resistance of the class's conducting cross-section, ` +
        `${formatScaled(Number(e.bulkOhmPerM.toPrecision(4)), 6)} Ω/µm at ${e.temperatureC} °C — impossible, since size effects only add ` +
        `resistance. Check the unit (Ω/µm) and the class's width, thickness and barrier.`;
    else message = `${row}: the measured resistance must be greater than 0 and finite.`;
    throw badRequest(message, { [`measured.${e.index}.${FIELD[e.field]}`]: [message] });
  }
}
