import "server-only";
import type { z } from "zod";
import { ApiError, DEFAULT_JSON_LIMIT, readJson } from "@/lib/api";

/**
 * readJson whose 400 message also names the first problems ("Some fields are not valid: Width must be
 * greater than 0."), so a script that only prints `message` still learns what to fix; `fields` keeps them all.
 */
export async function readInput<T extends z.ZodType>(req: Request, schema: T, maxBytes = DEFAULT_JSON_LIMIT): Promise<z.infer<T>> {
  try {
    return await readJson(req, schema, maxBytes);
  } catch (e) {
    if (e instanceof ApiError && e.status === 400 && e.fields) {
      const msgs = [...new Set(Object.values(e.fields).flat())];
      const head = msgs.slice(0, 3).join(" ");
      throw new ApiError(400, e.code, `Some fields are not valid: ${head}${msgs.length > 3 ? ` (and ${msgs.length - 3} more)` : ""}`, e.fields);
    }
    throw e;
  }
}
