// Times GET requests to each URL in argv, one after another per URL with a 50 ms pause, until stdin
// closes; then prints { url: [ms, …] } as JSON. Run as its own process so the bench's own work (the
// stand-ins live in the bench process) does not slow the measuring.
const urls = process.argv.slice(2);
const times: Record<string, number[]> = Object.fromEntries(urls.map((u) => [u, []]));
let done = false;
process.stdin.on("end", () => (done = true)).resume();

async function loop(url: string) {
  while (!done) {
    const t = performance.now();
    const res = await fetch(url, { redirect: "manual" });
    await res.arrayBuffer();
    times[url].push(performance.now() - t);
    await new Promise((r) => setTimeout(r, 50));
  }
}
await Promise.all(urls.map(loop));
process.stdout.write(JSON.stringify(times));
export {};
