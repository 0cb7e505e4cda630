import { env, type ServiceMode } from "~/env.server";
import { sequelize } from "~/db.server";
import { ping as pingStorage } from "~/services/storage.server";
import { ping as pingMail } from "~/services/mail.server";
import { ping as pingPayments } from "~/services/payments.server";

// Whether each service Loadline depends on answers right now; used by GET /healthz.

export interface Check {
  ok: boolean;
  mode: ServiceMode;
  ms: number;
  error?: string;
}

export interface Health {
  ok: boolean;
  checks: { database: Check; storage: Check; mail: Check; payments: Check };
}

const TIMEOUT_MS = 5_000;

async function timed(mode: ServiceMode, probe: () => Promise<unknown>): Promise<Check> {
  const started = performance.now();
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      probe(),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error(`no answer within ${TIMEOUT_MS / 1000} s`)), TIMEOUT_MS);
      }),
    ]);
    return { ok: true, mode, ms: Math.round(performance.now() - started) };
  } catch (err) {
    const message = err instanceof Error ? err.message || err.name : String(err);
    return { ok: false, mode, ms: Math.round(performance.now() - started), error: message };
  } finally {
    clearTimeout(timer);
  }
}

export async function checkHealth(): Promise<Health> {
  const settings = env();
  const [database, storage, mail, payments] = await Promise.all([
    timed("real", () => sequelize.query("select 1")),
    timed(settings.s3.mode, pingStorage),
    timed(settings.mail.mode, pingMail),
    timed(settings.stripe.mode, pingPayments),
  ]);
  const checks = { database, storage, mail, payments };
  return { ok: Object.values(checks).every((c) => c.ok), checks };
}
