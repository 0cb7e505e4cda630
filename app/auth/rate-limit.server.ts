import { QueryTypes } from "sequelize";
import { sequelize } from "~/db.server";
import { SignInAttempt } from "~/models/sign-in-attempt.server";
import { queueAccountMail } from "~/auth/account-mail.server";

// Failed password sign-ins slow guessing down without letting anyone lock an owner out:
// - per account and address (tight): one address guessing one account. A success from that
//   address clears it.
// - per address: one address trying many accounts. Never cleared by a success, or an attacker
//   could clear it by signing in to an account of their own.
// - per account, all addresses together: past a threshold each further try must wait a delay that
//   doubles with every failure, up to a ceiling. Addresses that signed in to the account before
//   are exempt, so the owner's own address stays open however many others guess.
// The account is the typed e-mail address, whether or not an account has it, so the limits do not
// reveal which addresses exist. The owner is e-mailed once a window when failures pile up.
export const SIGN_IN_LIMITS = {
  windowMinutes: 15,
  perAccountAndAddress: 5,
  perAddress: 30,
  accountWindowMinutes: 60,
  accountDelayAfter: 10,
  accountMaxDelaySeconds: 300,
  knownAddressDays: 30,
  ownerWarningAfter: 5,
} as const;

export type RateDecision = { allowed: true } | { allowed: false; retryAfterSeconds: number };

export function tooManyAttemptsMessage(retryAfterSeconds: number): string {
  if (retryAfterSeconds < 60) {
    return `Too many sign-in attempts; try again in ${retryAfterSeconds} second${retryAfterSeconds === 1 ? "" : "s"}.`;
  }
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
  const hops = forwarded
    .split(",")
    .map((h) => h.trim())
    .filter(Boolean);
  return hops.at(-1)?.slice(0, 64) ?? null;
}

const L = SIGN_IN_LIMITS;

async function freeAt(sql: string, replacements: Record<string, unknown>): Promise<Date | null> {
  const rows = await sequelize.query<{ free_at: Date | null }>(sql, { replacements, type: QueryTypes.SELECT });
  return rows[0]?.free_at ? new Date(rows[0].free_at) : null;
}

// The limit-th most recent failure since the last success: when it leaves the window the count drops below the limit.
const pairSql = `
  SELECT attempted_at + make_interval(mins => :minutes) AS free_at
    FROM sign_in_attempts
   WHERE email = :email AND address IS NOT DISTINCT FROM :address AND NOT succeeded
     AND attempted_at > GREATEST(now() - make_interval(mins => :minutes), COALESCE(
           (SELECT max(attempted_at) FROM sign_in_attempts
             WHERE email = :email AND address IS NOT DISTINCT FROM :address AND succeeded), '-infinity'))
   ORDER BY attempted_at DESC OFFSET :offset LIMIT 1`;

const addressSql = `
  SELECT attempted_at + make_interval(mins => :minutes) AS free_at
    FROM sign_in_attempts
   WHERE address = :address AND NOT succeeded AND attempted_at > now() - make_interval(mins => :minutes)
   ORDER BY attempted_at DESC OFFSET :offset LIMIT 1`;

// 2^(failures − threshold) seconds after the latest failure, unless this address is one the
// account has signed in from.
const accountSql = `
  WITH recent AS (
    SELECT count(*) FILTER (WHERE NOT succeeded AND attempted_at > now() - make_interval(mins => :minutes)) AS failures,
           max(attempted_at) FILTER (WHERE NOT succeeded) AS last_failure,
           coalesce(bool_or(succeeded AND address = :address), false) AS known
      FROM sign_in_attempts
     WHERE email = :email AND attempted_at > now() - make_interval(days => :days)
  ), due AS (
    SELECT last_failure + make_interval(secs => least(:maxDelay::float8, power(2::float8, (failures - :after)::float8))) AS free_at
      FROM recent WHERE NOT known AND failures >= :after
  )
  SELECT free_at FROM due WHERE free_at > now()`;

export async function checkSignInAllowed(email: string, address: string | null): Promise<RateDecision> {
  const normalised = email.trim().toLowerCase();
  const until = (
    await Promise.all([
      freeAt(pairSql, { email: normalised, address, minutes: L.windowMinutes, offset: L.perAccountAndAddress - 1 }),
      address ? freeAt(addressSql, { address, minutes: L.windowMinutes, offset: L.perAddress - 1 }) : null,
      freeAt(accountSql, {
        email: normalised,
        address,
        minutes: L.accountWindowMinutes,
        days: L.knownAddressDays,
        after: L.accountDelayAfter,
        maxDelay: L.accountMaxDelaySeconds,
      }),
    ])
  )
    .filter((d): d is Date => d !== null)
    .sort((a, b) => b.getTime() - a.getTime())[0];
  if (!until) return { allowed: true };
  return { allowed: false, retryAfterSeconds: Math.max(1, Math.ceil((until.getTime() - Date.now()) / 1000)) };
}

export async function recordSignInAttempt(email: string, address: string | null, succeeded: boolean) {
  const normalised = email.trim().toLowerCase();
  await SignInAttempt.create({ email: normalised, address, succeeded });
  if (!succeeded) await warnOwnerOfFailures(normalised);
  // Failures only matter for a day; successes are kept longer, to know the account's own addresses.
  await sequelize.query(
    `DELETE FROM sign_in_attempts
      WHERE email = :email AND attempted_at < now() - interval '1 day'
        AND (NOT succeeded OR attempted_at < now() - make_interval(days => :days))`,
    { replacements: { email: normalised, days: L.knownAddressDays } },
  );
}

/**
 * Once failures against an account pile up, its owner hears about it: once per window, however
 * many follow. The same query runs for an address without an account (it matches no row).
 */
async function warnOwnerOfFailures(email: string) {
  await sequelize.transaction(async (transaction) => {
    const [claimed] = await sequelize.query<{ id: string }>(
      `UPDATE users SET sign_in_warning_at = now()
        WHERE email = :email
          AND (sign_in_warning_at IS NULL OR sign_in_warning_at < now() - make_interval(mins => :minutes))
          AND (SELECT count(*) FROM sign_in_attempts
                WHERE email = :email AND NOT succeeded AND attempted_at > now() - make_interval(mins => :minutes)) >= :after
        RETURNING id`,
      {
        replacements: { email, minutes: L.accountWindowMinutes, after: L.ownerWarningAfter },
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    if (claimed) await queueAccountMail({ kind: "sign-in-warning", userId: claimed.id }, transaction);
  });
}

/** What the owner's warning says: failures in the last window, and from how many addresses. */
export async function recentFailures(email: string): Promise<{ failures: number; addresses: number }> {
  const [row] = await sequelize.query<{ failures: number; addresses: number }>(
    `SELECT count(*)::int AS failures, count(DISTINCT address)::int AS addresses
       FROM sign_in_attempts
      WHERE email = :email AND NOT succeeded AND attempted_at > now() - make_interval(mins => :minutes)`,
    { replacements: { email: email.trim().toLowerCase(), minutes: L.accountWindowMinutes }, type: QueryTypes.SELECT },
  );
  return row ?? { failures: 0, addresses: 0 };
}
