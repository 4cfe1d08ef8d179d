import { register } from "node:module";

/**
 * `server-only` throws when imported outside a React Server Component bundle. The demo seeder runs as a
 * plain Node script but reuses the app's db/queries modules, so map the package to an empty module here.
 */
const hook = `
export async function resolve(specifier, context, next) {
  if (specifier === "server-only") return { url: "data:text/javascript,export {};", shortCircuit: true };
  return next(specifier, context);
}`;
register(`data:text/javascript,${encodeURIComponent(hook)}`);
