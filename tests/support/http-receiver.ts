import { createServer, type IncomingHttpHeaders } from "node:http";
import type { AddressInfo } from "node:net";

// A throw-away HTTP endpoint on a free loopback port that records what it receives (webhook tests).

export interface Received {
  method: string;
  path: string;
  headers: IncomingHttpHeaders;
  body: string;
}

export async function startReceiver(answer: (req: Received, index: number) => number | Promise<number> = () => 200) {
  const received: Received[] = [];
  const waiters: { count: number; resolve: () => void }[] = [];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c) => chunks.push(c));
    const reply = async () => {
      const entry = { method: req.method ?? "", path: req.url ?? "", headers: req.headers, body: Buffer.concat(chunks).toString("utf8") };
      received.push(entry);
      const status = await answer(entry, received.length - 1);
      res.writeHead(status, { "content-type": "application/json" }).end(JSON.stringify({ status }));
      for (const w of waiters.filter((w) => received.length >= w.count)) w.resolve();
    };
    req.on("end", () => void reply());
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url,
    received,
    /** Resolves once `count` requests have arrived; rejects after timeoutMs. */
    waitFor(count: number, timeoutMs = 5_000): Promise<void> {
      if (received.length >= count) return Promise.resolve();
      return new Promise((resolve, reject) => {
        const timer = setTimeout(() => reject(new Error(`only ${received.length} of ${count} requests arrived`)), timeoutMs);
        waiters.push({ count, resolve: () => (clearTimeout(timer), resolve()) });
      });
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
