import path from "node:path";
import compression from "compression";
import express from "express";
import { createRequestHandler } from "@react-router/express";
import type { ServerBuild } from "react-router";
import { env } from "../app/env.server";
import { commonSecurityHeaders } from "../app/http/security-headers.server";
import { root } from "./stack";

// The production web server: the built app behind Express, so the app sees the client's address.
const settings = env();
const build = (await import(path.join(root, "build/server/index.js"))) as ServerBuild;

const app = express();
app.disable("x-powered-by");
app.use(compression());
// Every response (JSON, media, static files) carries the common security headers; documents get
// them with their policy from app/entry.server.tsx, so they are filled in only where missing.
const securityHeaders = commonSecurityHeaders({ https: settings.appUrl.startsWith("https://") });
app.use((_req, res, next) => {
  const writeHead = res.writeHead;
  res.writeHead = function (this: typeof res, ...args: Parameters<typeof writeHead>) {
    for (const [name, value] of securityHeaders) if (!res.hasHeader(name)) res.setHeader(name, value);
    return writeHead.apply(this, args);
  } as typeof writeHead;
  next();
});
app.use((req, _res, next) => {
  // Sign-in rate limits key on the client address; a client's own X-Forwarded-For is not trusted.
  if (!settings.trustProxy || !req.headers["x-forwarded-for"]) {
    req.headers["x-forwarded-for"] = req.socket.remoteAddress ?? "";
  }
  next();
});
app.use("/assets", express.static(path.join(root, "build/client/assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(path.join(root, "build/client"), { maxAge: "1h" }));
app.all("*", createRequestHandler({ build, mode: "production" }));

const server = app.listen(settings.port, settings.host, () => {
  console.log(`[web] listening on http://${settings.host}:${settings.port}`);
});
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.once(signal, () => server.close(() => process.exit(0)));
}
