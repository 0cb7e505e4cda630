import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterEach, describe, expect, it } from "vitest";
import fc from "fast-check";
import { parseEnv } from "~/env.server";
import { localSessionSecret, SECRET_FILE } from "../../scripts/local-secret";

// No secret in the source: the environment must bring one, and the local profiles keep their own.
const A = "a".repeat(32);
const B = "b".repeat(40);

function refusal(source: NodeJS.ProcessEnv): string {
  try {
    parseEnv(source);
  } catch (error) {
    return (error as Error).message;
  }
  throw new Error("expected parseEnv to refuse");
}

describe("SESSION_SECRET", () => {
  it("refuses to start without it, naming the variable, in every mode", () => {
    for (const source of [
      {},
      { NODE_ENV: "production", APP_URL: "http://127.0.0.1:3000" },
      { NODE_ENV: "production", APP_URL: "https://market.example" },
      { NODE_ENV: "test" },
      { SESSION_SECRET: "" },
    ]) {
      expect(refusal(source)).toMatch(/^Loadline cannot start[\s\S]*\n {2}SESSION_SECRET is not set/);
    }
  });

  it("refuses a short secret, and a short one among several", () => {
    expect(refusal({ SESSION_SECRET: "too-short" })).toMatch(/SESSION_SECRET\S* must be at least 32 characters/);
    expect(refusal({ SESSION_SECRET: `${A},short` })).toMatch(/SESSION_SECRET\.1 must be at least 32 characters/);
    expect(refusal({ SESSION_SECRET: " , " })).toMatch(/SESSION_SECRET has no secret in it/);
  });

  it("takes several, comma-separated, in order: the first signs, all verify", () => {
    expect(parseEnv({ SESSION_SECRET: A }).sessionSecrets).toEqual([A]);
    expect(parseEnv({ SESSION_SECRET: ` ${B} , ${A} ` }).sessionSecrets).toEqual([B, A]);
  });

  it("reads any list of secrets back in order, whatever the spacing around the commas", () => {
    const secret = fc.string({ minLength: 32, maxLength: 80 }).filter((s) => !s.includes(",") && s.trim() === s && s.length >= 32);
    const space = fc.constantFrom("", " ", "  ", "\t");
    fc.assert(
      fc.property(fc.array(fc.tuple(secret, space, space), { minLength: 1, maxLength: 4 }), (parts) => {
        const value = parts.map(([s, before, after]) => `${before}${s}${after}`).join(",");
        expect(parseEnv({ SESSION_SECRET: value }).sessionSecrets).toEqual(parts.map(([s]) => s));
      }),
    );
  });

  it("keeps no secret of its own in the source", () => {
    const source = fs.readFileSync(path.resolve(import.meta.dirname, "../../app/env.server.ts"), "utf8");
    expect(source).not.toMatch(/SESSION_SECRET\s*\?\?|sessionSecrets?:\s*raw\.SESSION_SECRET\s*\?\?/);
    expect(source).not.toMatch(/not-for-production/);
  });
});

describe("the local profile's secret file", () => {
  const dirs: string[] = [];
  const scratch = () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "loadline-secret-"));
    dirs.push(dir);
    return path.join(dir, "profile");
  };
  afterEach(() => {
    for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
  });

  it("is made on first start with mode 0600, random and long enough for parseEnv", () => {
    const dir = scratch();
    const first = localSessionSecret(dir);
    expect(first.created).toBe(true);
    expect(first.file).toBe(path.join(dir, SECRET_FILE));
    expect(fs.statSync(first.file).mode & 0o777).toBe(0o600);
    expect(fs.readFileSync(first.file, "utf8").trim()).toBe(first.secret);
    expect(parseEnv({ SESSION_SECRET: first.secret }).sessionSecrets).toEqual([first.secret]);
    expect(localSessionSecret(scratch()).secret).not.toBe(first.secret);
  });

  it("is reused on later starts, and its mode tightened if someone loosened it", () => {
    const dir = scratch();
    const first = localSessionSecret(dir);
    fs.chmodSync(first.file, 0o644);
    const again = localSessionSecret(dir);
    expect(again).toEqual({ ...first, created: false });
    expect(fs.statSync(first.file).mode & 0o777).toBe(0o600);
  });

  it("is replaced when damaged, still 0600", () => {
    const dir = scratch();
    fs.mkdirSync(dir, { recursive: true });
    fs.writeFileSync(path.join(dir, SECRET_FILE), "short\n", { mode: 0o644 });
    const made = localSessionSecret(dir);
    expect(made.created).toBe(true);
    expect(made.secret.length).toBeGreaterThanOrEqual(32);
    expect(fs.statSync(made.file).mode & 0o777).toBe(0o600);
  });
});
