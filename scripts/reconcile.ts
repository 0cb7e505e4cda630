// `npm run reconcile [-- --order <id> …]`: compares the ledger per order with the payment provider's
// charges, refunds and transfers (through the SDK, so against the local stand-in unless
// STRIPE_SECRET_KEY is set) and prints each difference; `--order` narrows it to those orders.
// Exits 1 when there is a difference, 2 when it could not run.
import { parseArgs } from "node:util";
import { randomBytes } from "node:crypto";

// Nothing here signs a cookie, but the app's environment rules want a session secret.
process.env.SESSION_SECRET ||= randomBytes(48).toString("base64url");
const { sequelize } = await import("~/db.server");
const { reconcile, describeDifference } = await import("~/payments/reconcile.server");

const { values } = parseArgs({ options: { order: { type: "string", multiple: true } } });

try {
  const differences = await reconcile({ orderIds: values.order });
  if (differences.length === 0) {
    console.log("The ledger and the payment provider agree.");
  } else {
    console.log(`${differences.length} difference${differences.length === 1 ? "" : "s"} between the ledger and the payment provider:`);
    for (const d of differences) console.log(`  ${describeDifference(d)}`);
    process.exitCode = 1;
  }
} catch (error) {
  console.error("Reconciling failed:", error);
  process.exitCode = 2;
} finally {
  await sequelize.close();
}
