import { randomBytes } from "node:crypto";
import type { CreationAttributes } from "sequelize";
import { Listing, User } from "~/models/index.server";
import type { Role } from "~/auth/roles";
import { blankListing } from "./blank-listing";

// Accounts and live listings made straight in the database by an integration suite, named for the
// suite and this run, and removed with everything they listed when the suite is done.

export function madeAccounts(suite: string) {
  const run = randomBytes(4).toString("hex");
  const made: string[] = [];
  const label = suite[0].toUpperCase() + suite.slice(1);

  async function account(name: string, roles: Role[] = ["buyer"]): Promise<User> {
    const user = await User.create({
      email: `${suite}-it-${run}-${name}@example.test`,
      displayName: `${label} ${name}`,
      passwordHash: null,
      roles,
      emailVerifiedAt: new Date(),
      lastSignInAt: null,
    });
    made.push(user.id);
    return user;
  }

  /** A live amplifier of `sellerId`'s at €480 in Germany, serviced and measured, unless told otherwise. */
  function liveAmplifier(sellerId: string, extra: Partial<CreationAttributes<Listing>> = {}): Promise<Listing> {
    return Listing.create(
      blankListing(sellerId, "integrated_amplifier", {
        status: "live",
        maker: "Fenwold Acoustics",
        model: `FW-${randomBytes(2).toString("hex")}`,
        priceMinor: 48_000,
        currency: "EUR",
        country: "DE",
        town: "Oskerfeld",
        cosmeticGrade: "clean",
        serviceState: "serviced_measured",
        publishedAt: new Date(),
        ...extra,
      }),
    );
  }

  async function cleanUp() {
    await Listing.destroy({ where: { sellerId: made } });
    await User.destroy({ where: { id: made } });
  }

  return { run, account, liveAmplifier, cleanUp };
}
