import nextCoreWebVitals from "eslint-config-next/core-web-vitals";
import nextTypescript from "eslint-config-next/typescript";

const config = [
  ...nextCoreWebVitals,
  ...nextTypescript,
  {
    ignores: [".next/**", "node_modules/**", "data/**", "db/migrations/**", "test-results/**", "playwright-report/**", "next-env.d.ts", "tmp/**", "tmp-shots.ts"],
  },
  {
    rules: {
      // Dropping a field with a rest pattern ({ line, ...fields }) is the idiom for "all but this one".
      "@typescript-eslint/no-unused-vars": ["error", { ignoreRestSiblings: true, argsIgnorePattern: "^_" }],
    },
  },
  {
    // Components never reach into the database: they go through route handlers.
    files: ["components/**/*.{ts,tsx}"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["@/db", "@/db/*"], message: "Components fetch through the API; only route handlers, server actions and server pages call db/." }] }],
    },
  },
  {
    // lib/ is pure domain code.
    files: ["lib/**/*.ts"],
    ignores: ["lib/env.ts", "lib/auth/**"],
    rules: {
      "no-restricted-imports": ["error", { patterns: [{ group: ["@/db", "@/db/*", "react", "next", "next/*"], message: "lib/ stays free of React, HTTP and the database." }] }],
    },
  },
];

export default config;
