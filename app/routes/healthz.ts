import { checkHealth } from "~/services/health.server";

// GET /healthz/ready (and GET /healthz, which scripts and older balancers poll): 200 when the
// database, object storage, mail and payments all answered their last check, else 503. Checks are
// kept for a few seconds, so polling this often costs the services nothing more.
// Public by design: it reveals no data, only reachability.
export async function loader() {
  const health = await checkHealth();
  return Response.json(health, { status: health.ok ? 200 : 503, headers: { "Cache-Control": "no-store" } });
}
