// Lint rules that make the project's boundaries visible: the tagger package does no I/O and has no
// hidden clocks or randomness; only config/env.ts reads the environment in the API.
import js from "@eslint/js";
import tseslint from "typescript-eslint";

export default tseslint.config(
  { ignores: ["**/node_modules/**", "**/dist/**", "**/.data/**", "**/coverage/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_" }],
      "@typescript-eslint/no-non-null-assertion": "off",
      "no-empty": ["error", { allowEmptyCatch: true }],
    },
  },
  // Plain Node scripts: TypeScript is not there to know Node's globals, and no-undef adds nothing.
  { files: ["**/*.{js,mjs,cjs}"], rules: { "no-undef": "off" } },
  {
    files: ["packages/tagger/src/**/*.ts"],
    ignores: ["packages/tagger/src/cli.ts", "packages/tagger/src/cli/**", "packages/tagger/src/**/*.test.ts", "packages/tagger/src/testing/**"],
    rules: {
      "no-restricted-imports": [
        "error",
        { patterns: [{ group: ["node:*", "fs", "path", "child_process", "pg", "http", "https", "os"], message: "The model package does no I/O; do it in apps/api or the CLI." }] },
      ],
      "no-restricted-globals": ["error", { name: "fetch", message: "No I/O in the model package." }, { name: "process", message: "Take options as arguments." }],
      "no-restricted-properties": [
        "error",
        { object: "Math", property: "random", message: "Pass a seeded Rng (src/util/random.ts)." },
        { object: "Date", property: "now", message: "Take a now() function from the caller." },
        { object: "console", message: "No logging in the model package." },
      ],
    },
  },
  {
    files: ["apps/api/src/**/*.ts"],
    ignores: ["apps/api/src/config/env.ts"],
    rules: {
      "no-restricted-properties": ["error", { object: "process", property: "env", message: "Import env from @/config/env." }],
    },
  },
);
