// Lint: the recommended rules of ESLint and typescript-eslint, the React hooks rules, and the
// boundaries between areas (eslint-plugin-boundaries): client features do not import each other,
// src/lib imports no feature, server areas import each other only through their public entry
// (index.ts), and the demo seeds import no route code.
import js from "@eslint/js";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";
import boundaries from "eslint-plugin-boundaries";

export const BOUNDARY_ELEMENTS = [
  { type: "server-module", pattern: "server/modules/*", mode: "folder", capture: ["module"] },
  { type: "server-legacy-routes", pattern: "server/routes", mode: "folder" },
  { type: "seed", pattern: "server/db/seed", mode: "folder" },
  { type: "feature", pattern: "src/features/*", mode: "folder", capture: ["feature"] },
  { type: "client-lib", pattern: "src/lib", mode: "folder" },
];

export const BOUNDARY_RULES = {
  "boundaries/element-types": [
    2,
    {
      default: "allow",
      rules: [
        { from: ["feature"], disallow: [["feature", { feature: "!${feature}" }]], message: "A feature does not import another feature; compose them in src/app/routes." },
        { from: ["client-lib"], disallow: ["feature"], message: "src/lib is below the features: it imports none of them." },
        { from: ["seed"], disallow: ["server-legacy-routes", "server-module"], message: "The demo seeds write records directly; they import no route or area code." },
      ],
    },
  ],
  "boundaries/entry-point": [
    2,
    {
      default: "allow",
      rules: [{ target: ["server-module"], disallow: "*", message: "Import another area only through its public entry, index.ts." }, { target: ["server-module"], allow: "index.ts" }],
    },
  ],
};

export default tseslint.config(
  { ignores: ["dist/**", "dist-server/**", "node_modules/**", "data/**", "public/**", ".tmp/**", "coverage/**", "tests/fixtures/**"] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ["src/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: {
      "react-hooks/rules-of-hooks": "error",
      "react-hooks/exhaustive-deps": "warn",
    },
  },
  {
    files: ["src/**/*.{ts,tsx}", "server/**/*.ts"],
    plugins: { boundaries },
    settings: {
      "boundaries/elements": BOUNDARY_ELEMENTS,
      "boundaries/include": ["src/**/*", "server/**/*"],
      "import/resolver": { typescript: { project: "tsconfig.json" } },
    },
    rules: BOUNDARY_RULES,
  },
  {
    rules: {
      "@typescript-eslint/no-unused-vars": ["error", { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none" }],
      "@typescript-eslint/no-explicit-any": "off",
    },
  },
);
