// GET /healthz/live: the process is up and its event loop answers. No database, storage or network
// call, so a balancer restarting stuck processes never restarts healthy ones for a slow dependency.
export function loader() {
  return Response.json({ ok: true }, { headers: { "Cache-Control": "no-store" } });
}
