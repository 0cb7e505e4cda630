import { randomBytes } from "node:crypto";
import fs from "node:fs";
import path from "node:path";

// The session secret of a local profile (.local/dev, .local/test): made at random on the first
// start, kept beside the profile's database where only this user can read it, and reused so that
// restarting `npm start` does not sign everyone out. Nothing outside a local profile uses it.

export const SECRET_FILE = "session-secret";

export type LocalSecret = { secret: string; file: string; created: boolean };

const usable = (s: string) => s.length >= 32 && !s.includes(",");

export function localSessionSecret(dir: string): LocalSecret {
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  const file = path.join(dir, SECRET_FILE);
  const kept = readKept(file);
  if (kept) return { secret: kept, file, created: false };

  const secret = randomBytes(48).toString("base64url");
  const fd = fs.openSync(file, "w", 0o600);
  try {
    // The mode given to open is masked by the umask and ignored for an existing file; set it outright.
    fs.fchmodSync(fd, 0o600);
    fs.writeSync(fd, `${secret}\n`);
  } finally {
    fs.closeSync(fd);
  }
  return { secret, file, created: true };
}

function readKept(file: string): string | null {
  let text: string;
  try {
    text = fs.readFileSync(file, "utf8").trim();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw error;
  }
  // A damaged file is replaced rather than stopping the local stack; local sessions just end.
  if (!usable(text)) return null;
  if ((fs.statSync(file).mode & 0o777) !== 0o600) fs.chmodSync(file, 0o600);
  return text;
}
