import path from "node:path";
import compression from "compression";
import express from "express";
import { createRequestHandler } from "@react-router/express";
import type { ServerBuild } from "react-router";
import { env } from "../app/env.server";
import { root } from "./stack";

// The production web server: the built app behind Express, so the app sees the client's address.
const settings = env();
const build = (await import(path.join(root, "build/server/index.js"))) as ServerBuild;

const app = express();
app.disable("x-powered-by");
app.use(compression());
app.use((req, _res, next) => {
  // Sign-in rate limits key on the client address; a client's own X-Forwarded-For is not trusted.
  if (!settings.trustProxy || !req.headers["x-forwarded-for"]) {
    req.headers["x-forwarded-for"] = req.socket.remoteAddress ?? "";
  }
  next();
});
app.use("/assets", express.static(path.join(root, "build/client/assets"), { immutable: true, maxAge: "1y" }));
app.use(express.static(path.join(root, "build/client"), { maxAge: "1h" }));
const handle = createRequestHandler({ build, mode: "production" });
app.all("*", (req, res, next) => void handle(req, res, next).catch(next));

const server = app.listen(settings.port, settings.host, () => {
  console.log(`[web] listening on http://${settings.host}:${settings.port}`);
});
for (const signal of ["SIGINT", "SIGTERM"] as const) {
  process.once(signal, () => server.close(() => process.exit(0)));
}
