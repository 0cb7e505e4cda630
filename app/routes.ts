import { type RouteConfig, index, route } from "@react-router/dev/routes";

export default [
  index("routes/home.tsx"),
  route("market", "routes/market.tsx"),
  // Photo sizes from object storage
  route("media/*", "routes/media.ts"),

  // Accounts, sign-in and roles
  route("sign-up", "routes/account/sign-up.tsx"),
  route("sign-in", "routes/account/sign-in.tsx"),
  route("sign-out", "routes/account/sign-out.tsx"),
  route("verify-email/:token", "routes/account/verify-email.tsx"),
  route("forgot-password", "routes/account/forgot-password.tsx"),
  route("reset-password/:token", "routes/account/reset-password.tsx"),
  route("auth/oauth", "routes/account/oauth-start.tsx"),
  route("auth/oauth/callback", "routes/account/oauth-callback.tsx"),
  route("account", "routes/account/account.tsx"),
  // Applying as a workshop (the document goes to the private bucket)
  route("account/workshop", "routes/account/workshop.tsx"),
  route("admin/users", "routes/admin/users.tsx"),
  route("desk", "routes/desk/desk.tsx"),
  // The review desk's item pages (moderators and admins): a listing, an account.
  route("desk/listings/:id", "routes/desk/listing.tsx"),
  route("desk/users/:id", "routes/desk/user.tsx"),
  // The public listing page (watch is its action)
  route("listings/:id", "routes/listings/listing.tsx"),
  // Reports to the review desk: a public listing, or a conversation by either of its sides
  route("listings/:id/report", "routes/listings/report.tsx"),
  route("messages/:threadId/report", "routes/messages/report.tsx"),
  // Compare: up to four units side by side; its action keeps the visitor's compare list
  route("compare", "routes/compare.tsx"),
  // The buyer's watch list: the page and its API
  route("watching", "routes/watching.tsx"),
  route("api/v1/watches", "routes/api.v1.watches.ts"),
  route("api/v1/watches/:listingId", "routes/api.v1.watches.$listingId.ts"),
  // Spec alerts (save the market's filters, manage them) and unsubscribe links from notices (no sign-in)
  route("alerts", "routes/alerts/alerts.tsx"),
  route("alerts/new", "routes/alerts/new.tsx"),
  route("unsubscribe/:token", "routes/alerts/unsubscribe.tsx"),
  // Service health (liveness, readiness; /healthz is readiness) and the payments provider's webhook
  route("healthz", "routes/healthz.ts"),
  route("healthz/ready", "routes/healthz.ts", { id: "routes/healthz-ready" }),
  route("healthz/live", "routes/healthz.live.ts"),
  route("api/v1/webhooks/stripe", "routes/api.v1.webhooks.stripe.ts"),
  // Capture analysis (the bench)
  route("api/v1/captures/analyze", "routes/api.v1.captures.analyze.ts"),
  route("api/v1/captures/:id", "routes/api.v1.captures.$id.ts"),
  route("api/v1/captures/:id/retry", "routes/api.v1.captures.$id.retry.ts"),
  // Bench-sheet check (open to anyone)
  route("api/v1/bench-sheets/check", "routes/api.v1.bench-sheets.check.ts"),
  // The seller's path: your listings, a new draft, the editor's steps
  route("sell", "routes/sell/index.tsx"),
  route("sell/new", "routes/sell/new.tsx"),
  route("sell/:id", "routes/sell/editor.tsx", [
    index("routes/sell/editor-index.tsx"),
    route("item", "routes/sell/item.tsx"),
    route("condition", "routes/sell/condition.tsx"),
    route("restoration", "routes/sell/restoration.tsx"),
    route("photos", "routes/sell/photos.tsx"),
    route("bench", "routes/sell/bench.tsx"),
    route("review", "routes/sell/review.tsx"),
  ]),
  // Search: the market's listings API; /:id is the owner's editor API and everyone else's public view
  route("api/v1/listings", "routes/api.v1.listings.ts"),
  route("api/v1/listings/:id", "routes/api.v1.listings.$id.ts"),
  // Listing photos (seller only)
  route("api/v1/listings/:id/photos", "routes/api.v1.listings.$id.photos.ts"),
  route("api/v1/listings/:id/photos/:photoId", "routes/api.v1.listings.$id.photos.$photoId.ts"),
  // Currencies: the admin's exchange rates, the buyer's display currency (a cookie)
  route("admin/rates", "routes/admin/rates.tsx"),
  route("currency", "routes/currency.tsx"),
  // Talking before buying: conversations (one per listing and buyer) and offers, pages and API
  route("messages", "routes/messages/index.tsx"),
  route("messages/:threadId", "routes/messages/thread.tsx"),
  route("api/v1/threads", "routes/api.v1.threads.ts"),
  route("api/v1/threads/:id/messages", "routes/api.v1.threads.$id.messages.ts"),
  route("api/v1/offers", "routes/api.v1.offers.ts"),
  route("api/v1/offers/:id", "routes/api.v1.offers.$id.ts"),
  // Buying: checkout, the buyer's purchases, the seller's sales, the desk's contested orders, the
  // admin's marketplace settings (fee, timings)
  route("checkout/:listingId", "routes/buying/checkout.tsx"),
  route("purchases", "routes/buying/purchases.tsx"),
  route("purchases/:orderId", "routes/buying/purchase.tsx"),
  route("sales", "routes/buying/sales.tsx"),
  route("sales/:orderId", "routes/buying/sale.tsx"),
  route("desk/orders/:orderId", "routes/desk/order.tsx"),
  // The desk's workshop applications: the item page and the document behind its short-lived signed link
  route("desk/workshops/:id", "routes/desk/workshop.tsx"),
  route("desk/documents/:id", "routes/desk/document.ts"),
  // A reported conversation, read-only for moderators
  route("desk/threads/:id", "routes/desk/thread.tsx"),
  // A contest's photos, metadata-free, through short-lived links (the buyer who sent them, moderators)
  route("orders/:orderId/contest-photos/:n", "routes/buying/contest-photo.ts"),
  route("admin/settings", "routes/admin/settings.tsx"),
  // Reputation: sellers' and workshops' public pages, the buyer's review of a completed order, the
  // seller's answer, and the desk's page for hiding an abusive review
  route("sellers/:id", "routes/sellers/seller.tsx"),
  route("workshops/:slug", "routes/sellers/workshop.tsx"),
  route("purchases/:orderId/review", "routes/buying/purchase-review.tsx"),
  route("sales/:orderId/review", "routes/buying/sale-review.tsx"),
  route("desk/reviews/:id", "routes/desk/review.tsx"),
  // Bench certificates: the PDF of a bench-verified unit, the public page its QR code leads to, the same as JSON
  route("listings/:id/certificate.pdf", "routes/listings/certificate.ts"),
  route("certificates/:id", "routes/certificates/certificate.tsx"),
  route("api/v1/certificates/:id", "routes/api.v1.certificates.$id.ts"),
  // The seller's money per month from the escrow ledger: the page, its CSV, the same as JSON
  route("sales/money", "routes/money/money.tsx"),
  route("sales/money.csv", "routes/money/money-csv.ts"),
  route("api/v1/sales/money", "routes/api.v1.sales.money.ts"),
  // The editor: deleting a draft (asks once more; a job clears its stored files)
  route("sell/:id/delete", "routes/sell/delete.tsx"),
  // The workshop's inventory: the /sell table's data and bulk actions, and its CSV export
  route("api/v1/inventory", "routes/api.v1.inventory.ts"),
  route("sell/inventory.csv", "routes/sell/inventory-csv.ts"),
  // Working in bulk (workshops): CSV import of units as drafts (the template and example files, an
  // import's progress page and API), restoration templates applied from the editor's restoration step
  route("sell/import", "routes/sell/import.tsx"),
  route("sell/import/template.csv", "routes/sell/import-file.ts", { id: "routes/sell/import-template" }),
  route("sell/import/example.csv", "routes/sell/import-file.ts", { id: "routes/sell/import-example" }),
  route("sell/import/:id", "routes/sell/import-status.tsx"),
  route("api/v1/imports", "routes/api.v1.imports.ts"),
  route("api/v1/imports/:id", "routes/api.v1.imports.$id.ts"),
  route("sell/templates", "routes/sell/templates.tsx"),
  route("api/v1/restoration-templates", "routes/api.v1.restoration-templates.ts"),
  route("api/v1/restoration-templates/:id", "routes/api.v1.restoration-templates.$id.ts"),
] satisfies RouteConfig;
