import type { z } from "zod";

/** Field names in one type and not in the other (never when both have the same fields). */
export type FieldDiff<A, B> = Exclude<keyof A, keyof B> | Exclude<keyof B, keyof A>;

/** True when A and B are the same type (both ways assignable); for unions of literals such as enum values. */
export type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;

/** T with the fields K allowed to be null: how a stored JSON document carries a non-finite number (NaN, ±Infinity). */
export type NullableFields<T, K extends keyof T> = Omit<T, K> & { [P in K]: T[P] | null };

/** T with the fields K optional: for fields that documents stored before they existed do not have. */
export type OptionalFields<T, K extends keyof T> = Omit<T, K> & { [P in K]?: T[P] };

/**
 * Ties a zod object schema to the type it mirrors (usually an engine type from lib/scaling): the schema must parse
 * to a value of that type AND list exactly its fields. An engine field that is added, removed or retyped then breaks
 * the build at the schema instead of slipping through a loose copy.
 *
 *   export const technologySchema = mirrorOf<Technology>()(z.object({ supplyV: …, clockHz: …, … }));
 *
 * When stored documents legitimately differ from the engine type (a ratio stored as null, a field old documents
 * lack), mirror `NullableFields<T, "…">` or `OptionalFields<T, "…">` so the difference is written down.
 */
export function mirrorOf<T>() {
  return <S extends z.ZodType<T>>(
    schema: S & ([FieldDiff<T, z.output<S>>] extends [never] ? unknown : { "fields that differ from the mirrored type": FieldDiff<T, z.output<S>> }),
  ): S => schema;
}
