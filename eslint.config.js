import tseslint from "typescript-eslint";

// app/engine, app/datasets, app/figures, app/exports and app/activity are pure: they run unchanged in the
// browser, the server, a worker and a benchmark. vega, vega-lite, d3-array, zod and
// @mathjax/* are pure too.
const PURE = ["app/engine", "app/datasets", "app/figures", "app/exports", "app/activity"];
const react = { group: ["react", "react/*", "react-dom", "react-dom/*", "react-vega", "vega-embed"], message: "Pure modules (app/engine, app/datasets, app/figures, app/exports) stay free of React." };
const framework = { group: ["react-router", "@react-router/*"], message: "Pure modules must not import the framework." };
const database = { group: ["kysely", "kysely/*", "pg", "pg/*"], message: "Pure modules must not touch the database." };
const serverOnly = { group: ["*.server", "*.server.ts", "**/.server/**"], message: "Pure modules must not import server-only code." };
const nodeBuiltins = [
  { group: ["node:*"], message: "Pure modules must run in the browser too: no node: imports." },
  { group: ["fs", "path", "crypto", "os", "child_process", "stream", "http", "https", "url", "util", "zlib"], message: "Pure modules must run in the browser too." },
];
const testsAndTesting = PURE.flatMap((dir) => [`${dir}/**/*.test.ts`, `${dir}/**/testing/**`]);

export default tseslint.config(
  { ignores: ["node_modules/**", "build/**", ".react-router/**", "storage/**", ".data/**"] },
  {
    files: ["**/*.ts", "**/*.tsx"],
    languageOptions: { parser: tseslint.parser },
    plugins: { "@typescript-eslint": tseslint.plugin },
    rules: {},
  },
  {
    files: PURE.map((dir) => `${dir}/**/*.{ts,tsx}`),
    ignores: testsAndTesting,
    rules: { "no-restricted-imports": ["error", { patterns: [react, framework, database, ...nodeBuiltins, serverOnly] }] },
  },
  {
    // Tests and their helpers may read files and start processes, but stay off React, the
    // framework, the database and server code like the modules they test.
    files: testsAndTesting,
    rules: { "no-restricted-imports": ["error", { patterns: [react, framework, database, serverOnly] }] },
  },
);
