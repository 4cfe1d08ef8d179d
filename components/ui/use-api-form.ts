"use client";
import { useState } from "react";
import { ApiRequestError, errorMessage, type FieldErrors } from "@/lib/api-client";

/**
 * State of a form that posts to the JSON API: field errors (shown at their fields), one message for the rest,
 * and busy while the request runs. `run(action)` clears both, runs the action and, on failure, keeps the
 * answer's field errors and a message: the server's own when no field was named, else `fieldsMessage` (none
 * by default). On success busy stays on: the action navigates away.
 */
export function useApiForm(opts: { fieldsMessage?: string } = {}) {
  const [fields, setFields] = useState<FieldErrors>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function run(action: () => Promise<void>): Promise<void> {
    setBusy(true);
    setFields({});
    setMessage(null);
    try {
      await action();
    } catch (err) {
      const f = err instanceof ApiRequestError ? err.fields : {};
      setFields(f);
      setMessage(Object.keys(f).length ? (opts.fieldsMessage ?? null) : errorMessage(err));
      setBusy(false);
    }
  }
  return { fields, message, busy, run };
}
