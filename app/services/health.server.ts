import { env, type ServiceMode } from "~/env.server";
import { sequelize } from "~/db.server";
import { ping as pingStorage } from "~/services/storage.server";
import { ping as pingMail } from "~/services/mail.server";
import { ping as pingPayments } from "~/services/payments.server";

// Readiness: whether each service Loadline depends on answers (GET /healthz/ready and /healthz).
// A balancer polls this from every node every few seconds; probing the database, storage, mail and
// payments on each call would load them more than visitors do. So each check is kept for a few
// seconds and only one probe per service is in flight: concurrent callers share it.
// Liveness (GET /healthz/live) does no I/O at all and lives in its route.

export const DEPENDENCIES = ["database", "storage", "mail", "payments"] as const;
export type Dependency = (typeof DEPENDENCIES)[number];

export interface Check {
  ok: boolean;
  mode: ServiceMode;
  /** How long the probe took. */
  ms: number;
  /** When the probe finished (ISO 8601, UTC); the answer may be up to CHECK_TTL_MS old. */
  checkedAt: string;
  error?: string;
}

export interface Health {
  ok: boolean;
  checks: Record<Dependency, Check>;
}

export type Probe = { mode: ServiceMode; run: () => Promise<unknown> };

/** How long a check's answer is reused; a failed check sooner, so a recovered service is seen soon. */
export const CHECK_TTL_MS = 5_000;
export const FAILED_CHECK_TTL_MS = 1_000;
const TIMEOUT_MS = 5_000;

async function timed({ mode, run }: Probe, now: () => number): Promise<Check> {
  const started = performance.now();
  let timer: NodeJS.Timeout | undefined;
  const done = (ok: boolean, error?: string): Check => ({
    ok,
    mode,
    ms: Math.round(performance.now() - started),
    checkedAt: new Date(now()).toISOString(),
    ...(error === undefined ? {} : { error }),
  });
  try {
    await Promise.race([
      run(),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`no answer within ${TIMEOUT_MS / 1000} s`)), TIMEOUT_MS);
      }),
    ]);
    return done(true);
  } catch (err) {
    return done(false, err instanceof Error ? err.message || err.name : String(err));
  } finally {
    clearTimeout(timer);
  }
}

/** Readiness over the given probes, each answer kept for a while, one probe per service at a time. */
export function createReadiness(
  probes: () => Record<Dependency, Probe>,
  {
    ttlMs = CHECK_TTL_MS,
    failedTtlMs = Math.min(ttlMs, FAILED_CHECK_TTL_MS),
    now = () => Date.now(),
  }: { ttlMs?: number; failedTtlMs?: number; now?: () => number } = {},
): () => Promise<Health> {
  const kept = new Map<Dependency, { check: Check; at: number }>();
  const inFlight = new Map<Dependency, Promise<Check>>();

  function check(name: Dependency, probe: Probe): Promise<Check> {
    const last = kept.get(name);
    if (last && now() - last.at < (last.check.ok ? ttlMs : failedTtlMs)) return Promise.resolve(last.check);
    let pending = inFlight.get(name);
    if (!pending) {
      pending = timed(probe, now).then((result) => {
        kept.set(name, { check: result, at: now() });
        inFlight.delete(name);
        return result;
      });
      inFlight.set(name, pending);
    }
    return pending;
  }

  return async () => {
    const all = probes();
    const results = await Promise.all(DEPENDENCIES.map((name) => check(name, all[name])));
    const checks = Object.fromEntries(DEPENDENCIES.map((name, i) => [name, results[i]])) as Record<Dependency, Check>;
    return { ok: results.every((c) => c.ok), checks };
  };
}

function serviceProbes(): Record<Dependency, Probe> {
  const settings = env();
  return {
    database: { mode: "real", run: () => sequelize.query("select 1") },
    storage: { mode: settings.s3.mode, run: pingStorage },
    mail: { mode: settings.mail.mode, run: pingMail },
    payments: { mode: settings.stripe.mode, run: pingPayments },
  };
}

/** This process's readiness: each service's last check, at most CHECK_TTL_MS old. */
export const checkHealth = createReadiness(serviceProbes);
