// Run by payments-jobs.test.ts as a separate process: one 'order-release' job whose process is
// killed (SIGKILL) right after the provider made the transfer, before the database write.
// Usage: tsx tests/support/release-child.ts <orderId> <amountMinor>
const [orderId, amount] = process.argv.slice(2);
const { armFault } = await import("~/payments/faults.server");
const { releaseOrder } = await import("~/payments/release.server");
armFault("release:after-transfer", { kill: true });
await releaseOrder(orderId, Number(amount));
console.log("not killed");
process.exit(0);
