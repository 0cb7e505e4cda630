import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { SignInAttempt } from "~/models/sign-in-attempt.server";

// Failed password sign-ins are counted per typed e-mail address (whether or not an account has it)
// and per client address. A successful sign-in clears the e-mail's count, never the address's:
// otherwise an attacker could reset their address by signing in to an account of their own.
export const SIGN_IN_LIMITS = {
  windowMinutes: 15,
  perEmail: 5,
  perAddress: 20,
} as const;

export type RateDecision = { allowed: true } | { allowed: false; retryAfterSeconds: number };

export function tooManyAttemptsMessage(retryAfterSeconds: number): string {
  const minutes = Math.max(1, Math.ceil(retryAfterSeconds / 60));
  return `Too many sign-in attempts; try again in ${minutes} minute${minutes === 1 ? "" : "s"}.`;
}

/**
 * The client's address: the last X-Forwarded-For hop, which is the one our own proxy (or server
 * entry) appends. Null when the request carries none; the per-address limit is then skipped rather
 * than putting every visitor in one bucket.
 */
export function clientAddress(request: Request): string | null {
  const forwarded = request.headers.get("x-forwarded-for");
  if (!forwarded) return null;
  const hops = forwarded.split(",").map((h) => h.trim()).filter(Boolean);
  return hops.at(-1)?.slice(0, 64) ?? null;
}

/** The moment the limit frees up again, or null when under it. */
async function blockedUntil(column: "email" | "address", value: string, limit: number, resetBySuccess: boolean) {
  const since = resetBySuccess
    ? `GREATEST(now() - make_interval(mins => :minutes),
         COALESCE((SELECT max(attempted_at) FROM sign_in_attempts WHERE ${column} = :value AND succeeded), '-infinity'))`
    : `now() - make_interval(mins => :minutes)`;
  // The limit-th most recent failure: when it leaves the window the count drops below the limit.
  const rows = await sequelize.query<{ free_at: Date }>(
    `SELECT attempted_at + make_interval(mins => :minutes) AS free_at
       FROM sign_in_attempts
      WHERE ${column} = :value AND NOT succeeded AND attempted_at > ${since}
      ORDER BY attempted_at DESC
      OFFSET :offset LIMIT 1`,
    { replacements: { value, minutes: SIGN_IN_LIMITS.windowMinutes, offset: limit - 1 }, type: QueryTypes.SELECT },
  );
  return rows[0] ? new Date(rows[0].free_at) : null;
}

export async function checkSignInAllowed(email: string, address: string | null): Promise<RateDecision> {
  const normalised = email.trim().toLowerCase();
  const [byEmail, byAddress] = await Promise.all([
    blockedUntil("email", normalised, SIGN_IN_LIMITS.perEmail, true),
    address ? blockedUntil("address", address, SIGN_IN_LIMITS.perAddress, false) : null,
  ]);
  const until = [byEmail, byAddress].filter((d): d is Date => d !== null).sort((a, b) => b.getTime() - a.getTime())[0];
  if (!until) return { allowed: true };
  return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((until.getTime() - Date.now()) / 1000)) };
}

export async function recordSignInAttempt(email: string, address: string | null, succeeded: boolean) {
  const normalised = email.trim().toLowerCase();
  await SignInAttempt.create({ email: normalised, address, succeeded });
  // Old rows only matter for the audit of a day; pruned per e-mail typed to keep the query indexed.
  await sequelize.query(
    `DELETE FROM sign_in_attempts WHERE email = :email AND attempted_at < now() - interval '1 day'`,
    { replacements: { email: normalised } },
  );
}
