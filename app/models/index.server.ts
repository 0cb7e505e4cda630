import { User } from "~/models/user.server";
import { Workshop } from "~/models/workshop.server";
import { Listing } from "~/models/listing.server";
import { ListingPhoto } from "~/models/listing-photo.server";
import { BenchSheet } from "~/models/bench-sheet.server";
import { RestorationEntry } from "~/models/restoration-entry.server";
import { Order } from "~/models/order.server";
import { OrderEvent } from "~/models/order-event.server";
import { LedgerEntry } from "~/models/ledger-entry.server";
import { OrderContest } from "~/models/order-contest.server";
import { MarketplaceSettings } from "~/models/marketplace-settings.server";
import { Review } from "~/models/review.server";
import { AuditRecord } from "~/models/audit-record.server";
import { DeskClaim } from "~/models/desk-claim.server";
import { DeskFlag } from "~/models/desk-flag.server";
import { WorkshopApplication } from "~/models/workshop-application.server";

// Each model initialises itself on import; this module wires the catalogue's associations.
// Import catalogue models from here so the associations are always in place.

// Guarded per association: in development a module reload re-creates a model class, and the new
// class needs its associations again while the untouched ones already have theirs.
function wire(model: { associations: Record<string, unknown> }, alias: string, declare: () => void) {
  if (!model.associations[alias]) declare();
}

wire(Workshop, "owner", () => Workshop.belongsTo(User, { foreignKey: "ownerId", as: "owner" }));
wire(User, "workshop", () => User.hasOne(Workshop, { foreignKey: "ownerId", as: "workshop" }));

wire(Listing, "seller", () => Listing.belongsTo(User, { foreignKey: "sellerId", as: "seller" }));
wire(User, "listings", () => User.hasMany(Listing, { foreignKey: "sellerId", as: "listings" }));
wire(Listing, "workshop", () => Listing.belongsTo(Workshop, { foreignKey: "workshopId", as: "workshop" }));
wire(Workshop, "listings", () => Workshop.hasMany(Listing, { foreignKey: "workshopId", as: "listings" }));

wire(Listing, "photos", () => Listing.hasMany(ListingPhoto, { foreignKey: "listingId", as: "photos" }));
wire(ListingPhoto, "listing", () => ListingPhoto.belongsTo(Listing, { foreignKey: "listingId", as: "listing" }));

wire(Listing, "benchSheet", () => Listing.hasOne(BenchSheet, { foreignKey: "listingId", as: "benchSheet" }));
wire(BenchSheet, "listing", () => BenchSheet.belongsTo(Listing, { foreignKey: "listingId", as: "listing" }));

wire(Listing, "restorationEntries", () => Listing.hasMany(RestorationEntry, { foreignKey: "listingId", as: "restorationEntries" }));
wire(RestorationEntry, "listing", () => RestorationEntry.belongsTo(Listing, { foreignKey: "listingId", as: "listing" }));

// Buying: an order belongs to its listing and both people; its timeline, ledger legs and contest hang off it.
wire(Order, "listing", () => Order.belongsTo(Listing, { foreignKey: "listingId", as: "listing" }));
wire(Order, "buyer", () => Order.belongsTo(User, { foreignKey: "buyerId", as: "buyer" }));
wire(Order, "seller", () => Order.belongsTo(User, { foreignKey: "sellerId", as: "seller" }));
wire(Order, "events", () => Order.hasMany(OrderEvent, { foreignKey: "orderId", as: "events" }));
wire(Order, "ledger", () => Order.hasMany(LedgerEntry, { foreignKey: "orderId", as: "ledger" }));
wire(Order, "contest", () => Order.hasOne(OrderContest, { foreignKey: "orderId", as: "contest" }));

// The review desk: who acted, who holds an item, and a flag's listing and reporter.
wire(AuditRecord, "actor", () => AuditRecord.belongsTo(User, { foreignKey: "actorId", as: "actor" }));
wire(DeskClaim, "moderator", () => DeskClaim.belongsTo(User, { foreignKey: "moderatorId", as: "moderator" }));
wire(DeskFlag, "listing", () => DeskFlag.belongsTo(Listing, { foreignKey: "listingId", as: "listing" }));
wire(DeskFlag, "reporter", () => DeskFlag.belongsTo(User, { foreignKey: "reporterId", as: "reporter" }));
// Workshop applications: each belongs to its workshop and the account that applied.
wire(WorkshopApplication, "workshop", () => WorkshopApplication.belongsTo(Workshop, { foreignKey: "workshopId", as: "workshop" }));
wire(WorkshopApplication, "applicant", () => WorkshopApplication.belongsTo(User, { foreignKey: "applicantId", as: "applicant" }));

// Reputation: a review belongs to its order and names both people.
wire(Review, "order", () => Review.belongsTo(Order, { foreignKey: "orderId", as: "order" }));
wire(Review, "buyer", () => Review.belongsTo(User, { foreignKey: "buyerId", as: "buyer" }));
wire(Order, "review", () => Order.hasOne(Review, { foreignKey: "orderId", as: "review" }));

export {
  User,
  Workshop,
  Listing,
  ListingPhoto,
  BenchSheet,
  RestorationEntry,
  Order,
  OrderEvent,
  LedgerEntry,
  OrderContest,
  MarketplaceSettings,
  Review,
  AuditRecord,
  DeskClaim,
  DeskFlag,
  WorkshopApplication,
};
