// In the browser zod must not try `new Function` (its fast path): the Content-Security-Policy
// forbids eval, and the probe, though caught, reports a policy violation on every page. root.tsx
// imports this first; the flag lands on the config object zod shares through globalThis, whether
// zod has loaded yet or not. The server keeps the fast path.
declare global {
  var __zod_globalConfig: { jitless?: boolean } | undefined;
}
if (typeof document !== "undefined") (globalThis.__zod_globalConfig ??= {}).jitless = true;
export {};
