// The request edge against a running server (built app, worker, stand-ins on the throw-away test
// stack): the web process's memory while over-limit bodies are sent chunked, and how fast the
// liveness check and a public listing page answer while a 48 MB capture is uploaded and analysed.
import { spawn } from "node:child_process";
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import { finished, root } from "../stack";
import { ms, pct, type Figure, type ServedApp } from "./served-app";

const MiB = 1024 * 1024;

function rssMiB(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
  return Number(/VmRSS:\s+(\d+)/.exec(status)![1]) / 1024;
}

/** Sends `total` bytes chunked (no Content-Length) until the server answers or drops the connection. */
function sendChunked(
  url: string,
  total: number,
  headers: Record<string, string>,
  head = "",
): Promise<{ status: number | string; sentMiB: number; body: string }> {
  return new Promise((resolve) => {
    let sent = 0;
    let done = false;
    const finish = (status: number | string, body = "") => {
      if (done) return;
      done = true;
      resolve({ status, sentMiB: Math.round((sent / MiB) * 10) / 10, body });
    };
    const req = http.request(url, { method: "POST", headers: { ...headers, "Transfer-Encoding": "chunked" } });
    req.on("response", (res) => {
      let body = "";
      res.setEncoding("utf8");
      res.on("data", (c) => (body += c));
      res.on("end", () => finish(res.statusCode ?? 0, body));
      res.on("error", () => finish(res.statusCode ?? 0, body));
    });
    req.on("error", (e) => setTimeout(() => finish(`connection closed (${(e as NodeJS.ErrnoException).code})`), 200));
    const chunk = Buffer.alloc(64 * 1024, 0x31);
    const pump = () => {
      if (sent === 0 && head) {
        req.write(head);
        sent += head.length;
      }
      while (!done && sent < total) {
        sent += chunk.length;
        if (!req.write(chunk)) return void req.once("drain", pump);
      }
      if (!done) req.end();
    };
    pump();
  });
}

/** A square wave's scope export, `time,volts`, of about `bytes`: rows until the size is reached. */
function squareCsv(bytes: number): Uint8Array {
  const rows: string[] = ["time,volts"];
  let size = 11;
  const dt = 1e-7; // 10 MS/s
  for (let i = 0; size < bytes; i++) {
    const t = i * dt;
    const phase = (t * 1000) % 1;
    const v = (phase < 0.5 ? 1 : -1) * (1 - Math.exp(-((phase % 0.5) * 1e-3) / 2e-6)) + Math.sin(i) * 1e-3;
    const row = `${t.toExponential(7)},${v.toFixed(6)}`;
    rows.push(row);
    size += row.length + 1;
  }
  return new TextEncoder().encode(rows.join("\n") + "\n");
}

/** Probes `urls` from a process of its own until `stop` resolves; the times per URL, in ms. */
async function probeWhile(urls: string[], until: Promise<unknown>): Promise<Record<string, number[]>> {
  const child = spawn(process.execPath, ["--import", "tsx", path.join(root, "scripts/bench/probe.ts"), ...urls], {
    cwd: root,
    stdio: ["pipe", "pipe", "inherit"],
  });
  let out = "";
  child.stdout.on("data", (c) => (out += c));
  await until;
  child.stdin.end();
  await finished(child);
  return JSON.parse(out) as Record<string, number[]>;
}

/** Needs the app served with a worker, fresh (its memory is measured from the start). */
export async function edgeFigures(app: ServedApp): Promise<{ figures: Figure[]; notes: string[] }> {
  const figures: Figure[] = [];
  const notes: string[] = [];
  const { base } = app;
  const web = app.web();
  const signIn = await fetch(`${base}/sign-in`, {
    method: "POST",
    redirect: "manual",
    headers: { Origin: base, "Content-Type": "application/x-www-form-urlencoded" },
    body: new URLSearchParams({ email: "seller@loadline.test", password: "bench-demo-2026", redirectTo: "/sell" }),
  });
  const cookie = (signIn.headers.getSetCookie().find((c) => c.startsWith("loadline_session=")) ?? "").split(";")[0];
  if (!cookie) throw new Error(`sign-in as the demo seller failed (${signIn.status})`);
  const market = await (await fetch(`${base}/market`)).text();
  const listing = /href="(\/listings\/[0-9a-f-]{36})"/.exec(market)?.[1];
  if (!listing) throw new Error("no public listing on /market");
  const live = (await fetch(`${base}/healthz/live`)).status === 200 ? "/healthz/live" : "/healthz";
  if (live === "/healthz")
    notes.push("/healthz/live is not on this branch yet: the liveness figures use /healthz, which checks every dependency on each call");

  // --- Memory while over-limit bodies are refused (a fresh, warmed-up process) ---
  for (let i = 0; i < 20; i++) await (await fetch(`${base}${listing}`)).arrayBuffer();
  await new Promise((r) => setTimeout(r, 1000));
  const baseline = rssMiB(web.pid!);
  const overLimit: [string, string, number, Record<string, string>, string][] = [
    [
      "40 MiB JSON to /api/v1/bench-sheets/check",
      "/api/v1/bench-sheets/check",
      40 * MiB,
      { "Content-Type": "application/json" },
      '{"notes":"',
    ],
    [
      "120 MiB multipart to /api/v1/captures/analyze",
      "/api/v1/captures/analyze?wait=0",
      120 * MiB,
      { "Content-Type": "multipart/form-data; boundary=BB", Cookie: cookie },
      '--BB\r\nContent-Disposition: form-data; name="file"; filename="s.csv"\r\nContent-Type: text/csv\r\n\r\nfrequency,level\n',
    ],
    [
      "100 MiB to /api/v1/webhooks/stripe",
      "/api/v1/webhooks/stripe",
      100 * MiB,
      { "Content-Type": "application/json", "Stripe-Signature": "t=1,v1=00" },
      '{"id":"',
    ],
  ];
  let peak = baseline;
  for (const [label, route, total, headers, head] of overLimit) {
    let localPeak = rssMiB(web.pid!);
    const sampler = setInterval(() => (localPeak = Math.max(localPeak, rssMiB(web.pid!))), 10);
    const out = await sendChunked(`${base}${route}`, total, headers, head);
    await new Promise((r) => setTimeout(r, 300));
    clearInterval(sampler);
    peak = Math.max(peak, localPeak);
    const code = /"error":"([a-z_]+)"/.exec(out.body)?.[1];
    figures.push({
      label: `${label}, chunked: answer ${out.status}${code ? ` ${code}` : ""} after ${out.sentMiB} MiB sent; web RSS peak above the start`,
      value: ms(localPeak - baseline),
      unit: "MiB",
      limit: 100,
    });
  }
  figures.push({
    label: `web RSS before the over-limit bodies ${ms(baseline)} MiB, peak while they were refused`,
    value: ms(peak),
    unit: "MiB",
  });

  // --- Latency while a 48 MB capture is uploaded and analysed (after 3 s without it, for comparison) ---
  const csv = squareCsv(48 * MiB);
  const urls = [`${base}${live}`, `${base}${listing}`];
  const what = (url: string) => (url.endsWith(live) ? `GET ${live} (liveness)` : `GET ${listing} (a public listing page)`);
  const idle = await probeWhile(urls, new Promise((r) => setTimeout(r, 3000)));
  for (const url of urls) {
    const t = idle[url];
    figures.push({
      label: `${what(url)} without the upload, ${t.length} requests: p50 ${ms(pct(t, 50))} ms, p95 ${ms(pct(t, 95))} ms, max`,
      value: ms(Math.max(...t)),
      unit: "ms",
    });
  }
  let uploadMs = 0;
  let uploadStatus = 0;
  let capture: { status: string; createdAt: string; finishedAt: string | null; error?: { error: string } } = {
    status: "queued",
    createdAt: "",
    finishedAt: null,
  };
  const t0 = performance.now();
  const work = (async () => {
    await new Promise((r) => setTimeout(r, 300));
    const form = new FormData();
    form.append("file", new Blob([csv as Uint8Array<ArrayBuffer>], { type: "text/csv" }), "scope-1k.csv");
    form.append("kind", "square");
    form.append("loadOhm", "8");
    const upload = await fetch(`${base}/api/v1/captures/analyze?wait=0`, {
      method: "POST",
      body: form,
      headers: { Cookie: cookie, Origin: base },
    });
    uploadMs = performance.now() - t0 - 300;
    uploadStatus = upload.status;
    const queued = (await upload.json()) as { id?: string; error?: string };
    if (!queued.id) throw new Error(`the capture upload was refused: ${JSON.stringify(queued)}`);
    const deadline = Date.now() + 180_000;
    while (capture.status !== "done" && capture.status !== "failed" && Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 250));
      capture = await (await fetch(`${base}/api/v1/captures/${queued.id}`, { headers: { Cookie: cookie } })).json();
    }
    await new Promise((r) => setTimeout(r, 300));
  })();
  const busy = await probeWhile(urls, work);
  const totalMs = performance.now() - t0;
  const analysedMs = capture.finishedAt ? Date.parse(capture.finishedAt) - Date.parse(capture.createdAt) : NaN;
  figures.push({
    label: `${(csv.length / MiB).toFixed(1)} MiB square-wave CSV: upload answered ${uploadStatus} in ${ms(uploadMs)} ms; the job ended ${capture.status}${capture.error ? ` (${capture.error.error})` : ""} ${ms(analysedMs)} ms after the row was made; ${ms(totalMs)} ms in all`,
    value: ms(totalMs),
    unit: "ms",
  });
  for (const url of urls) {
    const t = busy[url];
    const limited = !(url.endsWith(live) && live === "/healthz");
    figures.push({
      label: `${what(url)} meanwhile, ${t.length} requests: p50 ${ms(pct(t, 50))} ms, p95`,
      value: ms(pct(t, 95)),
      unit: "ms",
      ...(limited ? { limit: 200 } : {}),
    });
    figures.push({ label: `${what(url)} meanwhile, max`, value: ms(Math.max(...t)), unit: "ms", ...(limited ? { limit: 200 } : {}) });
  }
  figures.push({
    label: "load average over the last minute (2 cores, shared)",
    value: Math.round(os.loadavg()[0] * 100) / 100,
    unit: "",
  });
  return { figures, notes };
}
