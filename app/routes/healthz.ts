import { checkHealth } from "~/services/health.server";

// GET /healthz: 200 when the database, object storage, mail and payments all answer, else 503.
// Public by design (load balancers and `npm start` poll it); it reveals no data, only reachability.
export async function loader() {
  const health = await checkHealth();
  return Response.json(health, { status: health.ok ? 200 : 503, headers: { "cache-control": "no-store" } });
}
