// ESLint flat config: Next.js (core web vitals) and TypeScript rules; Prettier owns formatting.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";
import prettier from "eslint-config-prettier/flat";

export default defineConfig([
  ...nextVitals,
  ...nextTs,
  prettier,
  {
    rules: {
      // Unused names are errors, except the deliberate `_`-prefixed ones (destructuring to drop a field).
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none", ignoreRestSiblings: true }],
      "@typescript-eslint/consistent-type-imports": ["error", { fixStyle: "inline-type-imports" }],
    },
  },
  {
    // Tests read JSON answers of many shapes through one helper; `any` there keeps the assertions readable.
    files: ["tests/**/*.ts"],
    rules: { "@typescript-eslint/no-explicit-any": "off" },
  },
  {
    // The engine stays pure: nothing from the app, the database, React, Next or Node's I/O.
    files: ["lib/scaling/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["@/*", "../../*", "react", "react-dom", "next", "next/*", "knex", "better-sqlite3", "zod"],
              message: "lib/scaling imports nothing outside itself.",
            },
            { group: ["node:*", "fs", "path", "http", "https", "net", "child_process"], message: "lib/scaling does no I/O." },
          ],
        },
      ],
    },
  },
  {
    // db/ takes only types from lib/: the queries and write modules never run app code.
    files: ["db/**/*.ts", "migrations/**/*.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [{ group: ["@/lib/*", "@/components/*", "@/app/*"], allowTypeImports: true, message: "db/ imports only types from lib/." }],
        },
      ],
    },
  },
  globalIgnores([".next*/**", "node_modules/**", "data/**", "tmp/**", ".bench/**", "next-env.d.ts", "public/**", "test-results/**"]),
]);
