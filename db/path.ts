import path from "node:path";

/** SQLite file: PLATEAU_DB if set, else data/plateau.sqlite under the project. */
export function databasePath(): string {
  const fromEnv = process.env.PLATEAU_DB;
  if (fromEnv && fromEnv.trim() !== "") return path.resolve(fromEnv);
  return path.resolve(process.cwd(), "data", "plateau.sqlite");
}
