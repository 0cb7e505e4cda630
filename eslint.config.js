// `npm run lint`: type-aware ESLint over every TypeScript file, then `prettier --check`.
// Prettier owns layout (eslint-config-prettier switches ESLint's style rules off); ESLint looks for
// mistakes the compiler lets through. Needs `react-router typegen` first for the route types.
import js from "@eslint/js";
import { defineConfig } from "eslint/config";
import prettier from "eslint-config-prettier";
import reactHooks from "eslint-plugin-react-hooks";
import globals from "globals";
import tseslint from "typescript-eslint";

export default defineConfig(
  { ignores: ["build/", ".react-router/", ".local/", "coverage/", "test-results/", "public/"] },
  { linterOptions: { reportUnusedDisableDirectives: "error" } },
  js.configs.recommended,
  tseslint.configs.recommendedTypeChecked,
  reactHooks.configs.flat.recommended,
  {
    languageOptions: {
      globals: { ...globals.node, ...globals.browser },
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      // Casts only as `x as T`; an object or array literal gets a typed declaration instead, so the
      // compiler checks its fields.
      "@typescript-eslint/consistent-type-assertions": [
        "error",
        { assertionStyle: "as", objectLiteralTypeAssertions: "never", arrayLiteralTypeAssertions: "never" },
      ],
      // Loaders and actions throw React Router's redirect()/data() and Responses by design.
      "@typescript-eslint/only-throw-error": [
        "error",
        {
          allow: [
            { from: "lib", name: "Response" },
            { from: "package", package: "react-router", name: "DataWithResponseInit" },
          ],
        },
      ],
      // Re-raising what a .catch() received keeps its original value.
      "@typescript-eslint/prefer-promise-reject-errors": ["error", { allowThrowingUnknown: true }],
      // A form field read with String(form.get(…)) is a File only when a client sends junk; the zod
      // schema right after it refuses "[object File]" like any other bad text.
      "@typescript-eslint/no-base-to-string": ["error", { ignoredTypeNames: ["Error", "RegExp", "URL", "URLSearchParams", "File"] }],
      // `_name` marks a deliberately unused binding (dropping a field with a rest pattern, a
      // positional parameter).
      "@typescript-eslint/no-unused-vars": [
        "error",
        { argsIgnorePattern: "^_", varsIgnorePattern: "^_", caughtErrors: "none", ignoreRestSiblings: true },
      ],
      // Async functions without await implement Promise-returning interfaces (stand-ins, test
      // doubles) and turn a throw into a rejection; that is what they are for.
      "@typescript-eslint/require-await": "off",
      // Input checks match control characters on purpose, to refuse them (names, redirects, file headers).
      "no-control-regex": "off",
      "react-hooks/exhaustive-deps": "error",
      // These two describe what the React Compiler can optimise; Loadline does not run the compiler,
      // and keeps a "latest value" in a ref during render and marks hydration in an effect on purpose.
      "react-hooks/refs": "off",
      "react-hooks/set-state-in-effect": "off",
    },
  },
  {
    // Tests, stand-ins and scripts read JSON off the wire (`await res.json()` is `any`) and look into
    // it; typing each read would only add casts. The application code (app/, shared/) keeps these.
    files: ["tests/**", "fakes/**", "scripts/**", "db/**"],
    rules: {
      "@typescript-eslint/no-explicit-any": "off",
      "@typescript-eslint/no-unsafe-argument": "off",
      "@typescript-eslint/no-unsafe-assignment": "off",
      "@typescript-eslint/no-unsafe-call": "off",
      "@typescript-eslint/no-unsafe-member-access": "off",
      "@typescript-eslint/no-unsafe-return": "off",
    },
  },
  { files: ["**/*.js"], extends: [tseslint.configs.disableTypeChecked] },
  prettier,
);
