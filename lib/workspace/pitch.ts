import Decimal from "decimal.js";

/**
 * S that takes a class's pitch (width + spacing) to a target pitch, exact in decimal (issue 13 item 7): each SI value
 * read to 15 significant digits, as the editor shows it, and not rounded after — so the scaled pitch is the target
 * (an 18 nm target gives 18 nm, not 17.9999 nm). The engine's sFromTargetPitch in decimal.
 */
export function sFromPitchExact(c: { widthM: number; spacingM: number }, targetPitchM: number): number {
  const pitch = new Decimal(c.widthM).toSignificantDigits(15).plus(new Decimal(c.spacingM).toSignificantDigits(15));
  return pitch.div(new Decimal(targetPitchM).toSignificantDigits(15)).toNumber();
}

/** A class's pitch W + spacing in metres, exact in decimal. */
export function pitchExact(c: { widthM: number; spacingM: number }): number {
  return new Decimal(c.widthM).toSignificantDigits(15).plus(new Decimal(c.spacingM).toSignificantDigits(15)).toNumber();
}
