import { z } from "zod";

/**
 * Text hygiene for every name and note the API stores (team, baseline, scenario and report names, notes,
 * descriptions, class names in JSON and in CSV imports, display names…): no NUL or other control characters
 * (C0 U+0000–U+001F, DEL U+007F, C1 U+0080–U+009F; tab, line feed and carriage return are allowed where the text is
 * multi-line) and well-formed Unicode only (no unpaired UTF-16 surrogates, which a JSON "\ud800" escape can carry
 * and which cannot be stored as valid UTF-8). OWASP ASVS 4.0.3 5.1.4 (structured data is strongly typed and
 * validated against a defined schema, including allowed characters).
 */
export function textProblem(label: string, value: string, multiline: boolean): string | null {
  for (let i = 0; i < value.length; i++) {
    const c = value.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) {
      const next = value.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        i++;
        continue;
      }
      return `${label} is not valid Unicode (an unpaired surrogate U+${hex(c)} at character ${i + 1}).`;
    }
    if (c >= 0xdc00 && c <= 0xdfff) return `${label} is not valid Unicode (an unpaired surrogate U+${hex(c)} at character ${i + 1}).`;
    const control = c < 0x20 || (c >= 0x7f && c <= 0x9f);
    if (!control) continue;
    if (multiline && (c === 0x09 || c === 0x0a || c === 0x0d)) continue;
    const allowed = multiline ? " (tab and line breaks are allowed)" : "";
    return `${label} must not contain control characters: U+${hex(c)} at character ${i + 1}${allowed}.`;
  }
  return null;
}

const hex = (c: number) => c.toString(16).toUpperCase().padStart(4, "0");

/**
 * THE text helper of lib/validation: `schema` (a z.string() with its trim, length limits and messages) with the
 * text-hygiene check of textProblem added. Single-line text (names) by default; `{ multiline: true }` for notes,
 * descriptions and messages.
 */
export function cleanText<S extends z.ZodType<string>>(schema: S, label: string, opts: { multiline?: boolean } = {}): S {
  const multiline = opts.multiline ?? false;
  return schema.superRefine((v, ctx) => {
    const problem = textProblem(label, v, multiline);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  }) as unknown as S;
}

/**
 * Keys of records taken from JSON (overrides by class name, materials by metal id): zod drops an own "__proto__" key
 * without a word (assigning it would replace the prototype), so the request is refused instead, naming the key.
 */
export function withoutProtoKey<S extends z.ZodType>(schema: S, label: string) {
  return z
    .unknown()
    .superRefine((v, ctx) => {
      if (typeof v === "object" && v !== null && Object.prototype.hasOwnProperty.call(v, "__proto__"))
        ctx.addIssue({ code: "custom", path: ["__proto__"], message: `${label}: "__proto__" is not a valid key.` });
    })
    .pipe(schema);
}
