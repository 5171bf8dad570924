import tseslint from "typescript-eslint";

const pureRestriction = {
  patterns: [
    { group: ["react", "react/*", "react-dom", "react-dom/*", "react-vega", "vega-embed"], message: "app/engine and app/figures/pure stay free of React." },
    { group: ["react-router", "@react-router/*"], message: "Pure modules must not import the framework." },
    { group: ["kysely", "kysely/*", "pg", "pg/*"], message: "Pure modules must not touch the database." },
    { group: ["node:*"], message: "Pure modules must run in the browser too: no node: imports." },
    { group: ["fs", "path", "crypto", "os", "child_process", "stream", "http", "https", "url", "util", "zlib"], message: "Pure modules must run in the browser too." },
    { group: ["*.server", "*.server.ts", "**/.server/**"], message: "Pure modules must not import server-only code." },
  ],
};

export default tseslint.config(
  { ignores: ["node_modules/**", "build/**", ".react-router/**", "storage/**", ".data/**"] },
  {
    files: ["**/*.ts", "**/*.tsx"],
    languageOptions: { parser: tseslint.parser },
    plugins: { "@typescript-eslint": tseslint.plugin },
    rules: {},
  },
  {
    files: ["app/engine/**/*.ts"],
    ignores: ["app/engine/**/*.test.ts", "app/engine/testing/**"],
    rules: { "no-restricted-imports": ["error", pureRestriction] },
  },
  {
    files: ["app/exports/**/*.ts"],
    ignores: ["app/exports/**/*.test.ts"],
    rules: { "no-restricted-imports": ["error", pureRestriction] },
  },
);
