import bcrypt from "bcryptjs";
import { env } from "~/env.server";

// bcrypt cost 12 (about 0.4 s per hash with bcryptjs on one core); test runs (NODE_ENV=test or
// LOADLINE_FAST_HASH=1) use the minimum, 4, for speed.
export function passwordCost(): number {
  return env().passwordHashCost;
}

export async function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, passwordCost());
}

// Compared against when the account does not exist, so both paths cost one bcrypt comparison.
let decoy: Promise<string> | undefined;

/** True when `password` matches `hash`; with no hash it still spends the time of one comparison. */
export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  if (!hash) {
    decoy ??= bcrypt.hash("loadline-decoy-password", passwordCost());
    await bcrypt.compare(password, await decoy);
    return false;
  }
  return bcrypt.compare(password, hash);
}

/** A hash made at a lower cost than today's is replaced at the next successful sign-in. */
export function needsRehash(hash: string): boolean {
  return bcrypt.getRounds(hash) < passwordCost();
}

/** bcrypt reads at most 72 bytes; longer passwords would be silently cut, so they are refused. */
export function passwordTooLong(password: string): boolean {
  return bcrypt.truncates(password);
}
