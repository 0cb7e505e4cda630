import { z } from "zod";

// Parsed once at start-up. Each hosted service falls back to its local stand-in (fakes/) when its
// variables are absent, so a fresh clone runs with no configuration at all. SESSION_SECRET has no
// fallback: without it nothing starts; `npm start` and `npm test` pass their profile's own secret
// (scripts/local-secret.ts).

const port = z.coerce.number().int().min(1).max(65535);

// Cookies are signed with the first secret and accepted with any of them, so a new secret can be put
// first while cookies signed with the old one keep working until the old one is dropped.
const sessionSecrets = z
  .string({
    error: "is not set. Set at least 32 random characters (e.g. `openssl rand -base64 48`); `npm start` and `npm test` make their own",
  })
  .transform((value) =>
    value
      .split(",")
      .map((s) => s.trim())
      .filter(Boolean),
  )
  .pipe(z.array(z.string().min(32, "must be at least 32 characters (each one, when several are given)")).min(1, "has no secret in it"));

const EnvSchema = z
  .object({
    NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
    PORT: port.default(3000),
    HOST: z.string().default("127.0.0.1"),
    APP_URL: z.url().optional(),
    SESSION_SECRET: sessionSecrets,
    DATABASE_URL: z.url().default("postgres://loadline@127.0.0.1:54329/loadline"),

    S3_ENDPOINT: z.url().optional(),
    S3_REGION: z.string().default("us-east-1"),
    S3_ACCESS_KEY_ID: z.string().optional(),
    S3_SECRET_ACCESS_KEY: z.string().optional(),
    S3_BUCKET: z
      .string()
      .regex(/^[a-z0-9.-]{3,63}$/, "must be a valid bucket name")
      .default("loadline-media"),
    // Private documents (workshop applications): never served by /media, opened only through the
    // desk's short-lived signed links.
    S3_PRIVATE_BUCKET: z
      .string()
      .regex(/^[a-z0-9.-]{3,63}$/, "must be a valid bucket name")
      .default("loadline-private"),

    SMTP_URL: z.url().optional(),
    MAIL_FROM: z.string().default("Loadline <no-reply@loadline.test>"),

    OAUTH_ISSUER: z.url().optional(),
    OAUTH_CLIENT_ID: z.string().optional(),
    OAUTH_CLIENT_SECRET: z.string().optional(),

    STRIPE_SECRET_KEY: z.string().optional(),
    STRIPE_WEBHOOK_SECRET: z.string().optional(),
    STRIPE_API_URL: z.url().optional(),

    // Ports of the local stand-ins (fakes/); `npm test` moves them so it can run beside `npm start`.
    FAKE_S3_PORT: port.default(4569),
    FAKE_SMTP_PORT: port.default(1025),
    FAKE_MAIL_HTTP_PORT: port.default(1080),
    FAKE_OAUTH_PORT: port.default(4010),
    FAKE_STRIPE_PORT: port.default(12111),
    // Test runs only: bcrypt at its minimum cost so sign-ins in the browser suite stay quick.
    // Behind a load balancer that sets X-Forwarded-For; otherwise the socket's address is used.
    TRUST_PROXY: z.enum(["0", "1"], "must be 0 or 1").default("0"),
    LOADLINE_FAST_HASH: z.enum(["0", "1"], "must be 0 or 1").default("0"),
  })
  .superRefine((env, ctx) => {
    const groups: [string, (keyof typeof env)[]][] = [
      ["S3", ["S3_ENDPOINT", "S3_ACCESS_KEY_ID", "S3_SECRET_ACCESS_KEY"]],
      ["OAuth", ["OAUTH_ISSUER", "OAUTH_CLIENT_ID", "OAUTH_CLIENT_SECRET"]],
      ["Stripe", ["STRIPE_SECRET_KEY", "STRIPE_WEBHOOK_SECRET"]],
    ];
    for (const [name, keys] of groups) {
      const set = keys.filter((k) => env[k] !== undefined);
      if (set.length > 0 && set.length < keys.length) {
        for (const k of keys.filter((k) => env[k] === undefined)) {
          ctx.addIssue({ code: "custom", path: [k], message: `is required when the other ${name} variables are set` });
        }
      }
    }
  });

export type ServiceMode = "real" | "fake";

function resolve(raw: z.infer<typeof EnvSchema>) {
  const local = "127.0.0.1";
  const appUrl = raw.APP_URL ?? `http://${raw.HOST === "0.0.0.0" ? local : raw.HOST}:${raw.PORT}`;
  return {
    nodeEnv: raw.NODE_ENV,
    port: raw.PORT,
    host: raw.HOST,
    appUrl,
    secureCookies: appUrl.startsWith("https://"),
    sessionSecrets: raw.SESSION_SECRET,
    trustProxy: raw.TRUST_PROXY === "1",
    passwordHashCost: raw.LOADLINE_FAST_HASH === "1" || raw.NODE_ENV === "test" ? 4 : 12,
    databaseUrl: raw.DATABASE_URL,
    s3: raw.S3_ENDPOINT
      ? {
          mode: "real" as const,
          endpoint: raw.S3_ENDPOINT,
          region: raw.S3_REGION,
          accessKeyId: raw.S3_ACCESS_KEY_ID!,
          secretAccessKey: raw.S3_SECRET_ACCESS_KEY!,
          bucket: raw.S3_BUCKET,
          privateBucket: raw.S3_PRIVATE_BUCKET,
        }
      : {
          mode: "fake" as const,
          endpoint: `http://${local}:${raw.FAKE_S3_PORT}`,
          region: raw.S3_REGION,
          accessKeyId: "S3RVER",
          secretAccessKey: "S3RVER",
          bucket: raw.S3_BUCKET,
          privateBucket: raw.S3_PRIVATE_BUCKET,
          port: raw.FAKE_S3_PORT,
        },
    mail: raw.SMTP_URL
      ? { mode: "real" as const, smtpUrl: raw.SMTP_URL, from: raw.MAIL_FROM }
      : {
          mode: "fake" as const,
          smtpUrl: `smtp://${local}:${raw.FAKE_SMTP_PORT}`,
          from: raw.MAIL_FROM,
          smtpPort: raw.FAKE_SMTP_PORT,
          httpPort: raw.FAKE_MAIL_HTTP_PORT,
          inboxUrl: `http://${local}:${raw.FAKE_MAIL_HTTP_PORT}`,
        },
    oauth: raw.OAUTH_ISSUER
      ? {
          mode: "real" as const,
          issuer: raw.OAUTH_ISSUER,
          clientId: raw.OAUTH_CLIENT_ID!,
          clientSecret: raw.OAUTH_CLIENT_SECRET!,
        }
      : {
          mode: "fake" as const,
          issuer: `http://${local}:${raw.FAKE_OAUTH_PORT}`,
          clientId: "loadline-local",
          clientSecret: "loadline-local-secret",
          port: raw.FAKE_OAUTH_PORT,
        },
    stripe: raw.STRIPE_SECRET_KEY
      ? {
          mode: "real" as const,
          secretKey: raw.STRIPE_SECRET_KEY,
          webhookSecret: raw.STRIPE_WEBHOOK_SECRET!,
          apiUrl: raw.STRIPE_API_URL,
        }
      : {
          mode: "fake" as const,
          secretKey: "sk_test_loadline_local",
          webhookSecret: "whsec_loadline_local",
          apiUrl: `http://${local}:${raw.FAKE_STRIPE_PORT}`,
          port: raw.FAKE_STRIPE_PORT,
        },
  };
}

export type Env = ReturnType<typeof resolve>;

export function parseEnv(source: NodeJS.ProcessEnv = process.env): Env {
  // An exported but empty variable (as copied from .env.example) means "not set".
  const present = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ""));
  const result = EnvSchema.safeParse(present);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join(".") || "(environment)"} ${i.message}`);
    throw new Error(`Loadline cannot start: bad environment variables:\n${lines.join("\n")}`);
  }
  return resolve(result.data);
}

let cached: Env | undefined;
export function env(): Env {
  cached ??= parseEnv();
  return cached;
}
