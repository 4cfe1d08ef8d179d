import type { Knex } from "knex";
import { databasePath } from "./db/path";

// Used by the knex CLI (`npm run migrate`); the app and tests share `db/migrate.ts`,
// which runs the same files through a static migration source.
const config: Knex.Config = {
  client: "better-sqlite3",
  connection: { filename: databasePath() },
  useNullAsDefault: true,
  migrations: { directory: "./migrations", extension: "ts", loadExtensions: [".ts"] },
};

export default config;
