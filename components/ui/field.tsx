import type { ComponentProps, ReactNode } from "react";

const inputClass =
  "block w-full rounded-md border border-rule-strong bg-panel px-2.5 py-1.5 text-sm text-ink placeholder:text-faint focus:border-copper focus:outline-none focus:ring-2 focus:ring-copper/25 aria-[invalid=true]:border-bad";

/** A labelled input with its error list wired through aria-describedby. */
export function TextField({
  label,
  name,
  errors,
  hint,
  id,
  className = "",
  ...props
}: ComponentProps<"input"> & { label: ReactNode; name: string; errors?: string[]; hint?: ReactNode }) {
  const fieldId = id ?? `f-${name}`;
  const errId = `${fieldId}-error`;
  const hintId = `${fieldId}-hint`;
  const described = [hint ? hintId : null, errors?.length ? errId : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="mb-1 block text-sm font-medium text-ink">
        {label}
      </label>
      <input id={fieldId} name={name} aria-invalid={errors?.length ? true : undefined} aria-describedby={described} className={inputClass} {...props} />
      {hint ? (
        <p id={hintId} className="mt-1 text-xs text-muted">
          {hint}
        </p>
      ) : null}
      <FieldErrors id={errId} errors={errors} />
    </div>
  );
}

export function SelectField({
  label,
  name,
  errors,
  id,
  children,
  className = "",
  ...props
}: ComponentProps<"select"> & { label: ReactNode; name: string; errors?: string[] }) {
  const fieldId = id ?? `f-${name}`;
  const errId = `${fieldId}-error`;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="mb-1 block text-sm font-medium text-ink">
        {label}
      </label>
      <select
        id={fieldId}
        name={name}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? errId : undefined}
        className={inputClass}
        {...props}
      >
        {children}
      </select>
      <FieldErrors id={errId} errors={errors} />
    </div>
  );
}

export function FieldErrors({ id, errors }: { id: string; errors?: string[] }) {
  if (!errors?.length) return null;
  return (
    <ul id={id} className="mt-1 text-xs text-bad" aria-live="polite">
      {errors.map((e) => (
        <li key={e}>{e}</li>
      ))}
    </ul>
  );
}

export { inputClass };
