// Run by payments-jobs.test.ts as a separate process: one 'order-release' job whose process is
// killed (SIGKILL) right after the provider made the transfer, before the database write.
// Usage: node --import tsx tests/support/release-child.ts <orderId> <amountMinor>
import { armFault } from "~/payments/faults.server";
import { releaseOrder } from "~/payments/release.server";

const [orderId, amount] = process.argv.slice(2);
armFault("release:after-transfer", { kill: true });
await releaseOrder(orderId, Number(amount));
console.log("not killed");
process.exit(0);
