import { randomBytes } from "node:crypto";
import type { CreationAttributes } from "sequelize";
import { Listing, User } from "~/models/index.server";
import type { Role } from "~/auth/roles";
import { blankListing } from "../support/blank-listing";

// Shared by the messages and offers suites: accounts and live listings made straight in the
// database, and clean-up (threads, messages and offers go with their listing).

export const RUN = randomBytes(4).toString("hex");
const made: string[] = [];

export async function account(label: string, roles: Role[] = ["buyer"]): Promise<User> {
  const user = await User.create({
    email: `talk-it-${RUN}-${label}@example.test`,
    displayName: `Talk ${label}`,
    passwordHash: null,
    roles,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
  });
  made.push(user.id);
  return user;
}

/** A live amplifier of `sellerId`'s at €480 that welcomes offers, unless told otherwise. */
export function liveUnit(sellerId: string, extra: Partial<CreationAttributes<Listing>> = {}): Promise<Listing> {
  return Listing.create(
    blankListing(sellerId, "integrated_amplifier", {
      status: "live",
      maker: "Fenwold Acoustics",
      model: `FW-${randomBytes(2).toString("hex")}`,
      priceMinor: 48_000,
      currency: "EUR",
      offersWelcome: true,
      country: "DE",
      town: "Oskerfeld",
      cosmeticGrade: "clean",
      serviceState: "serviced_measured",
      publishedAt: new Date(),
      ...extra,
    }),
  );
}

export async function cleanUp() {
  await Listing.destroy({ where: { sellerId: made } });
  await User.destroy({ where: { id: made } });
}

export const hours = (h: number) => h * 3_600_000;
