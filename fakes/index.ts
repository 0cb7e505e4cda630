import path from "node:path";
import { pathToFileURL } from "node:url";
import { parseEnv, type Env } from "../app/env.server";
import { startMailCatcher } from "./mail-catcher";
import { startOAuthProvider, type Suggestions } from "./oauth-provider";
import { startS3Fake } from "./s3";
import { startStripeFake } from "./stripe/index";

// Starts the local stand-in of every hosted service that runs in fake mode (its real variables
// absent), on loopback only. State lives under dataDir: s3/, mail/, oauth/, stripe/.

export interface StartFakesOptions {
  env: Env;
  dataDir: string;
  /** Where the payments stand-in delivers events, e.g. `${APP_URL}/api/v1/webhooks/stripe`. */
  webhookUrl: string;
  log?: (line: string) => void;
  /** One-click choices on the sign-in screen (the demo accounts); a function is asked on each visit,
   *  so it may answer once the demo scenario is loaded. */
  oauthSuggestions?: Suggestions;
  /** Webhook retry waits; the default spreads retries over hours. */
  webhookRetryDelaysMs?: number[];
}

export interface RunningFakes {
  stop: () => Promise<void>;
  lines: string[];
}

export const webhookPath = "/api/v1/webhooks/stripe";
export const oauthCallbackPath = "/auth/oauth/callback";

export async function startFakes(opts: StartFakesOptions): Promise<RunningFakes> {
  const { env, dataDir } = opts;
  const log = opts.log ?? (() => {});
  const stops: (() => Promise<void>)[] = [];
  const lines: string[] = [];
  const row = (label: string, where: string) => lines.push(`${label.padEnd(16)}${where}`);
  const stopAll = async () => {
    for (const stop of stops.reverse()) await stop().catch(() => undefined);
  };

  try {
    const s3 = env.s3;
    const s3Port = s3.mode === "fake" ? s3.port : undefined;
    if (s3Port !== undefined) {
      const dir = path.join(dataDir, "s3");
      const fake = await guard("object storage", s3Port, () =>
        startS3Fake({ port: s3Port, directory: dir, buckets: [s3.bucket, s3.privateBucket] }),
      );
      stops.push(fake.stop);
      row("Object storage", `${fake.endpoint}  (buckets ${s3.bucket} and ${s3.privateBucket}, files in ${dir})`);
    } else row("Object storage", `${s3.endpoint}  (real service)`);

    const mail = env.mail;
    const smtpPort = mail.mode === "fake" ? mail.smtpPort : undefined;
    const httpPort = mail.mode === "fake" ? mail.httpPort : undefined;
    if (smtpPort !== undefined && httpPort !== undefined) {
      const fake = await guard("mail catcher", smtpPort, () =>
        startMailCatcher({ smtpPort, httpPort, file: path.join(dataDir, "mail", "messages.json") }),
      );
      stops.push(fake.stop);
      row("Mail (SMTP)", fake.smtpUrl);
      row("Mail inbox", fake.inboxUrl);
    } else row("Mail (SMTP)", "real relay from SMTP_URL");

    const oauth = env.oauth;
    const oauthPort = oauth.mode === "fake" ? oauth.port : undefined;
    if (oauthPort !== undefined) {
      const fake = await guard("identity provider", oauthPort, () =>
        startOAuthProvider({
          port: oauthPort,
          clientId: oauth.clientId,
          clientSecret: oauth.clientSecret,
          redirectUri: `${env.appUrl}${oauthCallbackPath}`,
          suggestions: opts.oauthSuggestions,
          keyFile: path.join(dataDir, "oauth", "signing-key.json"),
        }),
      );
      stops.push(fake.stop);
      row("Sign-in (OAuth)", fake.issuer);
    } else row("Sign-in (OAuth)", `${oauth.issuer}  (real provider)`);

    const stripe = env.stripe;
    const stripePort = stripe.mode === "fake" ? stripe.port : undefined;
    if (stripePort !== undefined) {
      const fake = await guard("payments stand-in", stripePort, () =>
        startStripeFake({
          port: stripePort,
          secretKey: stripe.secretKey,
          webhook: { url: opts.webhookUrl, secret: stripe.webhookSecret, retryDelaysMs: opts.webhookRetryDelaysMs },
          file: path.join(dataDir, "stripe", "state.json"),
          log,
        }),
      );
      stops.push(fake.stop);
      row("Payments", `${fake.url}  (webhooks to ${opts.webhookUrl})`);
    } else row("Payments", "real service (STRIPE_SECRET_KEY)");
  } catch (err) {
    await stopAll();
    throw err;
  }

  return { lines, stop: stopAll };
}

async function guard<T>(name: string, port: number, start: () => Promise<T>): Promise<T> {
  try {
    return await start();
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "EADDRINUSE") {
      throw new Error(`The local ${name} cannot listen on 127.0.0.1:${port}: the port is taken (is another Loadline running?).`, {
        cause: err,
      });
    }
    throw err;
  }
}

// `npx tsx fakes/index.ts`: the stand-ins alone, with the default environment, until Ctrl-C.
if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  const env = parseEnv();
  const running = await startFakes({
    env,
    dataDir: path.resolve(process.env.LOADLINE_FAKES_DIR ?? ".local/fakes"),
    webhookUrl: `${env.appUrl}${webhookPath}`,
    log: (line) => console.log(line),
  });
  console.log(["Local stand-ins running:", ...running.lines.map((l) => `  ${l}`), "Ctrl-C stops them."].join("\n"));
  const shutdown = () => {
    void running.stop().then(() => process.exit(0));
  };
  process.once("SIGINT", shutdown);
  process.once("SIGTERM", shutdown);
}
