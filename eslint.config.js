// Flat config. Besides the usual TypeScript and hooks checks, it enforces the one-way imports of
// the one-way imports of docs/import-walls.md with eslint-plugin-boundaries: a violation fails `npm run lint`.
import { defineConfig } from "eslint/config";
import tseslint from "typescript-eslint";
import reactHooks from "eslint-plugin-react-hooks";
import boundaries from "eslint-plugin-boundaries";
import pluginQuery from "@tanstack/eslint-plugin-query";
import importX from "eslint-plugin-import-x";
import { createTypeScriptImportResolver } from "eslint-import-resolver-typescript";
import prettier from "eslint-config-prettier";

/** Where each kind of code lives. More specific folders first: the first match names the element. */
const ELEMENTS = [
  { type: "client-app", pattern: "client/src/app" },
  { type: "client-feature", pattern: "client/src/features/*", capture: ["feature"] },
  { type: "client-shared", pattern: ["client/src/components", "client/src/lib", "client/src/config"] },
  { type: "server-engine", pattern: "server/engine" },
  { type: "server-feature", pattern: "server/features/*", capture: ["feature"] },
  { type: "server-http", pattern: "server/http" },
  { type: "server-platform", pattern: "server/platform" },
  { type: "server", pattern: "server" },
  { type: "shared", pattern: "shared" },
];

/**
 * Files with a role inside their element (plugin v7 file descriptors, which replace v6's `mode: "file"` elements):
 * a feature's public face (index.ts) is the one file of a server feature that other features may import.
 */
const FILES = [{ category: "feature-face", pattern: "server/features/*/index.ts" }];

const to = (...types) => ({ to: { element: { types: { anyOf: types } } } });
const client = ["client-app", "client-feature", "client-shared"];
const server = ["server", "server-engine", "server-feature", "server-http", "server-platform"];

const POLICIES = [
  // Client: shared UI and lib → features → app routes, never back. Imports inside one feature folder
  // are "internal" to the element and not checked, so this only catches one feature reaching into another.
  {
    from: { element: { type: "client-feature" } },
    disallow: [to("client-feature", "client-app")],
    message: "a client feature may not import another feature or the app; compose them in app/routes",
  },
  {
    from: { element: { type: "client-shared" } },
    disallow: [to("client-feature", "client-app")],
    message: "client components, lib and config may not import features or the app",
  },
  // The engine is pure computation: everything is refused, then its own files, shared contracts and zod are let back in.
  {
    from: { element: { type: "server-engine" } },
    disallow: [{ to: { module: { origin: "*" } } }],
    message: "server/engine imports only server/engine, shared/ and zod",
  },
  {
    from: { element: { type: "server-engine" } },
    allow: [
      to("server-engine", "shared"),
      { to: { module: { origin: "external", source: "zod" } } },
      // SHA-256 for the rotary fingerprint (server/engine/fingerprint.ts): deterministic, no I/O.
      { to: { module: { origin: "core", source: "node:crypto" } } },
    ],
  },
  // Contracts are shared by both sides, so they may depend on neither.
  {
    from: { element: { type: "shared" } },
    disallow: [to(...server, ...client)],
    message: "shared/ may not import server or client code",
  },
  // Server code never pulls in browser code, and the browser bundle never pulls in server code.
  {
    from: { element: { types: { anyOf: server } } },
    disallow: [to(...client)],
    message: "server code may not import client code",
  },
  {
    from: { element: { types: { anyOf: client } } },
    disallow: [to(...server)],
    message: "client code may not import server code; share contracts through shared/",
  },
  // Files inside one feature folder are internal to its element, so any server-feature → server-feature import crosses
  // features: it must go through the other feature's index.ts (the file the `feature-face` descriptor names).
  {
    from: { element: { type: "server-feature" } },
    disallow: [{ to: { element: { type: "server-feature", captured: { feature: "!{{ from.captured.feature }}" } } } }],
    message: "import another server feature only through its index.ts",
  },
  // A later policy wins over an earlier one: a feature's face is let back in.
  { from: { element: { type: "server-feature" } }, allow: [{ to: { file: { categories: "feature-face" } } }] },
  // The web layer (middleware) and the platform layer (audit, errors, identity) sit below every feature.
  {
    from: { element: { type: "server-http" } },
    disallow: [to("server-feature")],
    message: "server/http may not import features; put shared pieces in server/platform",
  },
  {
    from: { element: { type: "server-platform" } },
    disallow: [to("server-feature", "server-http")],
    message: "server/platform may not import features or server/http",
  },
];

export default defineConfig(
  { ignores: ["dist/**", "node_modules/**", ".data/**", ".tmp/**", "artifacts/**", "migrations/**"] },
  tseslint.configs.recommended,
  {
    files: ["**/*.{ts,tsx,js,mjs}"],
    languageOptions: { ecmaVersion: 2023, sourceType: "module" },
    rules: {
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrorsIgnorePattern: "^_", ignoreRestSiblings: true },
      ],
      // Pragmatic for a codebase written by several hands at once.
      "@typescript-eslint/no-empty-object-type": "off",
      "@typescript-eslint/no-namespace": "off",
    },
  },
  // Tests poke at loosely typed HTTP bodies; `any` there is a convenience, not a design smell.
  { files: ["tests/**/*.ts", "bench/**/*.ts"], rules: { "@typescript-eslint/no-explicit-any": "off" } },
  {
    files: ["client/**/*.{ts,tsx}"],
    plugins: { "react-hooks": reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
  // TanStack Query's own checks (exhaustive keys, stable clients, no rest-destructuring of results).
  ...pluginQuery.configs["flat/recommended"].map((config) => ({ ...config, files: ["client/**/*.{ts,tsx}"] })),
  // One cache per resource: query keys are written only by the query factories beside their fetchers
  // (features/<f>/api, lib/api); everywhere else a key comes from a factory, so two names can never split one cache.
  {
    files: ["client/**/*.{ts,tsx}"],
    ignores: ["client/src/features/*/api/**", "client/src/lib/api/**"],
    rules: {
      "no-restricted-syntax": [
        "error",
        {
          selector: "Property[key.name='queryKey'] > ArrayExpression",
          message: "take query keys from the resource's query factory (features/<f>/api or lib/api)",
        },
        {
          selector: "CallExpression[callee.property.name=/QueryData$/] > ArrayExpression",
          message: "take query keys from the resource's query factory (features/<f>/api or lib/api)",
        },
      ],
    },
  },
  {
    files: ["client/**/*.{ts,tsx}", "server/**/*.ts", "shared/**/*.ts"],
    plugins: { boundaries },
    settings: {
      "boundaries/elements": ELEMENTS,
      "boundaries/files": FILES,
      // The TypeScript resolver follows tsconfig.json's paths, so `@/` and `@shared/` imports meet the same walls.
      "import/resolver": { typescript: { project: "tsconfig.json" } },
      "boundaries/legacy-templates": false,
    },
    rules: {
      // Externals and unknown local files are checked too, so the engine cannot reach for node:fs or scripts/.
      "boundaries/dependencies": [
        "error",
        { default: "allow", checkAllOrigins: true, checkUnknownLocals: true, policies: POLICIES },
      ],
    },
  },
  // No import cycles anywhere in our code (through aliases too): a cycle is a wall crossed in both directions.
  {
    files: ["client/**/*.{ts,tsx}", "server/**/*.ts", "shared/**/*.ts"],
    plugins: { "import-x": importX },
    settings: {
      ...importX.flatConfigs.typescript.settings,
      "import-x/resolver-next": [createTypeScriptImportResolver({ project: "tsconfig.json" })],
    },
    rules: { "import-x/no-cycle": ["error", { ignoreExternal: true }] },
  },
  // Routers parse, authorise and answer; data access goes through the feature's service.
  {
    files: ["server/features/*/*.router.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            {
              group: ["**/*.repo", "**/db/schema", "**/db/schema/*"],
              message: "a router reads data through its feature's service, not a repo or the schema",
            },
          ],
        },
      ],
    },
  },
  // Services and repos stay web-agnostic: they throw server/platform errors and never import express middleware.
  {
    files: ["server/features/**/*.ts"],
    ignores: ["server/features/*/*.router.ts", "server/features/*/index.ts"],
    rules: {
      "no-restricted-imports": [
        "error",
        {
          patterns: [
            { group: ["**/http/*"], message: "only routers import server/http; throw server/platform/errors instead" },
          ],
        },
      ],
    },
  },
  // Formatting is Prettier's job (`npm run format:check`); lint keeps no style rules that could disagree with it.
  prettier,
);
