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
  {
    // The browser's main thread takes engine values only from the light entry (lib/scaling/client.ts): the evaluating
    // half and its capacitance tables load in the editor's Web Worker (engine-worker.ts), keeping first-load JS small.
    files: ["components/**/*.ts", "components/**/*.tsx", "lib/validation/**/*.ts", "lib/import/**/*.ts"],
    // engine-worker.ts runs in the Web Worker; engine-main.ts is loaded only by dynamic import after the first paint
    ignores: ["components/workspace/engine-worker.ts", "components/workspace/engine-main.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          paths: [
            {
              name: "@/lib/scaling",
              allowTypeImports: true,
              message: 'Import engine values from "@/lib/scaling/client" here (evaluation runs in the Web Worker); types may come from "@/lib/scaling".',
            },
          ],
          patterns: [
            {
              group: ["@/lib/scaling/*", "!@/lib/scaling/client", "!@/lib/scaling/types", "!@/lib/scaling/formats"],
              allowTypeImports: true,
              message: 'Import engine values from "@/lib/scaling/client" here.',
            },
            {
              group: ["**/engine-main", "@/components/workspace/engine-main"],
              allowTypeImports: true,
              message: "engine-main (the engine's tables) loads only by dynamic import, after the first paint (use-evaluation.ts).",
            },
          ],
        },
      ],
    },
  },
  globalIgnores([".next*/**", "node_modules/**", "data/**", "tmp/**", ".bench/**", "next-env.d.ts", "public/**", "test-results/**"]),
]);
