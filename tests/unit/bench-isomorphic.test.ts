import path from "node:path";
import { build } from "esbuild";
import { describe, expect, it } from "vitest";

// The seller's editor runs shared/bench in the browser (docs/decisions/0005): it must bundle for the
// browser on its own, with no Node built-ins and nothing from the server side of the app.
const root = path.resolve(import.meta.dirname, "../..");

describe("shared/bench stays isomorphic", () => {
  it("bundles for the browser with no Node built-ins or server modules", async () => {
    const result = await build({
      entryPoints: [path.join(root, "shared/bench/index.ts")],
      bundle: true,
      write: false,
      platform: "browser",
      format: "esm",
      metafile: true,
      logLevel: "silent",
      alias: { "@shared": path.join(root, "shared") },
    });
    expect(result.errors).toEqual([]);
    const inputs = Object.keys(result.metafile.inputs);
    expect(inputs.filter((i) => i.startsWith("node:") || /(^|\/)app\//.test(i) || i.endsWith(".server.ts"))).toEqual([]);
    expect(inputs.some((i) => i.includes("shared/bench/rules"))).toBe(true);
  });
});
