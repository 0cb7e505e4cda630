import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "~/db.server";
import { hashPassword } from "~/auth/password.server";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry, User, Workshop } from "~/models/index.server";
import { deleteObjects, putObject, randomKey } from "~/services/storage.server";
import { photoKeyPrefix } from "~/catalogue/media-url";
import { checkBenchSheet } from "@shared/bench/verdict";
import { benchSheetSchema } from "@shared/bench/schema";
import { ShippingOptionsSchema, type ShippingOption } from "@shared/catalogue-schemas";
import { listingFacets, publishState } from "@shared/listing-facets";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_UNITS, DEMO_WORKSHOPS, SELLER_PLACES, type AccountKey, type DemoUnit } from "./demo-data";
import { drawDemoPhotos } from "./demo-photo-files";
import { seedDemoCaptures } from "./demo-captures";
import { seedDemoImpedance } from "./demo-impedance";
import { seedDemoUnitCaptures } from "./demo-captures-units";
import { seedDemoWowCaptures } from "./demo-wow-captures";
import { seedDemoPayouts } from "./demo-payouts";
import { seedDemoApplications } from "./demo-applications";
import { seedDemoSales } from "./demo-sales";

// Loads the invented demo scenario. Idempotent: accounts are matched by e-mail, workshops by slug and
// listings by (seller, serial number); anything already there is left exactly as it is, so a restart
// neither duplicates nor resets what people changed while trying the demo.

export interface SeedResult {
  created: boolean;
  accounts: { email: string; role: string }[];
}

const DAY = 86_400_000;

export async function seedDemo(): Promise<SeedResult> {
  const accounts = DEMO_ACCOUNTS.map(({ email, role }) => ({ email, role }));

  // What is missing decides what to draw and upload; the transaction below re-checks under a lock.
  const missing = await missingUnits();
  const uploads = await uploadPhotos(missing);
  const uploadedKeys = uploads.flatMap((u) => u.photos.flatMap((p) => [p.originalKey, p.thumbKey, p.listingKey, p.zoomKey]));

  let created = false;
  const usedKeys = new Set<string>();
  try {
    await sequelize.transaction(async (t) => {
      // One seeder at a time (npm start and npm test may share a cluster).
      await sequelize.query(`SELECT pg_advisory_xact_lock(hashtext('loadline-demo-seed'))`, { transaction: t });
      const users = await ensureAccounts(t);
      created ||= users.created;
      const workshops = await ensureWorkshops(users.ids, t);
      created ||= workshops.created;
      for (const unit of DEMO_UNITS) {
        const photos = uploads.find((u) => u.serial === unit.serial)?.photos ?? [];
        const made = await ensureListing(unit, users.ids, workshops.ids, photos, t);
        if (made) {
          created = true;
          for (const p of photos) [p.originalKey, p.thumbKey, p.listingKey, p.zoomKey].forEach((k) => usedKeys.add(k));
        }
      }
    });
  } catch (error) {
    await deleteObjects(uploadedKeys).catch(() => undefined);
    throw error;
  }
  // A concurrent seeder may have created some listings first: their photos here belong to nobody.
  const orphans = uploadedKeys.filter((k) => !usedKeys.has(k));
  if (orphans.length) await deleteObjects(orphans);
  created = (await seedDemoCaptures()).created || created;
  created = (await seedDemoImpedance()).created > 0 || created;
  created = (await seedDemoUnitCaptures()).created > 0 || created;
  created = (await seedDemoWowCaptures()).created > 0 || created;
  created = (await seedDemoPayouts()).connected > 0 || created;
  created = (await seedDemoApplications()).created > 0 || created;
  // Completed sales (and their reviews) need the sellers' payout accounts connected just above.
  const sales = await seedDemoSales((unit, users, workshops) => sequelize.transaction((t) => ensureListing(unit, users, workshops, [], t)));
  created = sales.created > 0 || created;
  return { created, accounts };
}

async function missingUnits(): Promise<DemoUnit[]> {
  const rows = await sequelize.query<{ serial_number: string; email: string }>(
    `SELECT l.serial_number, u.email FROM listings l JOIN users u ON u.id = l.seller_id WHERE l.serial_number IN (:serials)`,
    { replacements: { serials: DEMO_UNITS.map((u) => u.serial) }, type: QueryTypes.SELECT },
  );
  const emailOf = (key: AccountKey) => DEMO_ACCOUNTS.find((a) => a.key === key)!.email.toLowerCase();
  const have = new Set(rows.map((r) => `${r.email.toLowerCase()}|${r.serial_number}`));
  return DEMO_UNITS.filter((u) => !have.has(`${emailOf(u.seller)}|${u.serial}`));
}

interface UploadedPhoto {
  originalKey: string;
  thumbKey: string;
  listingKey: string;
  zoomKey: string;
  width: number;
  height: number;
  phash: string;
  byteSize: number;
}

async function uploadPhotos(units: DemoUnit[]): Promise<{ serial: string; photos: UploadedPhoto[] }[]> {
  const jobs = units.flatMap((u) => Array.from({ length: u.photos ?? 1 }, (_, view) => ({ category: u.category, key: u.serial, view })));
  const files = await drawDemoPhotos(jobs);
  const bySerial = new Map<string, UploadedPhoto[]>(units.map((u) => [u.serial, []]));
  const jpeg = { contentType: "image/jpeg" };
  const written: string[] = [];
  const put = async (key: string, body: Buffer) => {
    await putObject(key, body, jpeg);
    written.push(key);
  };
  try {
    // A few uploads at a time: enough to keep the connection busy, few enough for the local stand-in.
    for (let start = 0; start < jobs.length; start += 6) {
      await Promise.all(
        jobs.slice(start, start + 6).map(async (job, k) => {
          const f = files[start + k];
          const keys = {
            originalKey: randomKey(photoKeyPrefix("original"), "jpg"),
            thumbKey: randomKey(photoKeyPrefix("thumb"), "jpg"),
            listingKey: randomKey(photoKeyPrefix("listing"), "jpg"),
            zoomKey: randomKey(photoKeyPrefix("zoom"), "jpg"),
          };
          await Promise.all([
            put(keys.originalKey, f.full),
            put(keys.thumbKey, f.thumb),
            put(keys.listingKey, f.full),
            put(keys.zoomKey, f.full),
          ]);
          bySerial.get(job.key)![job.view] = {
            ...keys,
            width: f.width,
            height: f.height,
            phash: f.phash,
            byteSize: f.full.length,
          };
        }),
      );
    }
  } catch (error) {
    // Nothing half-made: photos uploaded before the failure would belong to no listing.
    await deleteObjects(written).catch(() => undefined);
    throw error;
  }
  return [...bySerial].map(([serial, photos]) => ({ serial, photos }));
}

async function ensureAccounts(t: Transaction): Promise<{ ids: Record<AccountKey, string>; created: boolean }> {
  const ids: Partial<Record<AccountKey, string>> = {};
  let created = false;
  let hash: string | undefined;
  for (const a of DEMO_ACCOUNTS) {
    const existing = await User.findOne({ where: { email: a.email }, transaction: t });
    if (existing) {
      ids[a.key] = existing.id;
      continue;
    }
    hash ??= await hashPassword(DEMO_PASSWORD);
    const user = await User.create(
      {
        email: a.email,
        displayName: a.displayName,
        roles: a.roles,
        passwordHash: hash,
        emailVerifiedAt: new Date(),
        lastSignInAt: null,
      },
      { transaction: t },
    );
    ids[a.key] = user.id;
    created = true;
  }
  // The loop above visits every demo account.
  return { ids: ids as Record<AccountKey, string>, created };
}

async function ensureWorkshops(users: Record<AccountKey, string>, t: Transaction) {
  const ids: Partial<Record<AccountKey, string>> = {};
  let created = false;
  for (const w of DEMO_WORKSHOPS) {
    const existing = await Workshop.findOne({ where: { slug: w.slug }, transaction: t });
    if (existing) {
      ids[w.owner] = existing.id;
      continue;
    }
    const verifiedAt = w.verifiedDaysAgo === null ? null : new Date(Date.now() - w.verifiedDaysAgo * DAY);
    const row = await Workshop.create(
      {
        ownerId: users[w.owner],
        name: w.name,
        slug: w.slug,
        about: w.about,
        country: w.country,
        region: w.region,
        town: w.town,
        verificationStatus: verifiedAt ? "verified" : "applied",
        verifiedAt,
      },
      { transaction: t },
    );
    ids[w.owner] = row.id;
    created = true;
  }
  return { ids, created };
}

function shippingFor(unit: DemoUnit, town: string): ShippingOption[] {
  const kg = unit.weightKg;
  const pence = (pounds: number) => Math.round(pounds) * 100;
  const options: ShippingOption[] = [{ method: "collection", note: `From ${town}, by appointment.` }];
  if (kg < 25) {
    options.push({
      method: "parcel",
      prices: {
        domestic: pence(12 + kg * 1.2),
        nearby: pence(35 + kg * 2.5),
        ...(kg < 12 ? { worldwide: pence(80 + kg * 6) } : {}),
      },
    });
  }
  if (kg >= 15) options.push({ method: "freight", prices: { domestic: pence(85 + kg * 1.5), nearby: pence(160 + kg * 3) } });
  return ShippingOptionsSchema.parse(options);
}

export async function ensureListing(
  unit: DemoUnit,
  users: Record<AccountKey, string>,
  workshops: Partial<Record<AccountKey, string>>,
  photos: UploadedPhoto[],
  t: Transaction,
): Promise<boolean> {
  const sellerId = users[unit.seller];
  const existing = await Listing.findOne({ where: { sellerId, serialNumber: unit.serial }, attributes: ["id"], transaction: t });
  if (existing) return false;

  const sheet = unit.sheet ? benchSheetSchema.parse(unit.sheet) : null;
  const verdict = sheet ? checkBenchSheet(sheet) : null;
  const state = publishState(verdict);
  const status = unit.status ?? state.status;
  const place = SELLER_PLACES[unit.seller]!;
  // Spread publish times through the day so the newest-first order is stable and believable.
  const publishedAt = new Date(Date.now() - unit.daysAgo * DAY - (unit.serial.charCodeAt(3) % 12) * 3_600_000);
  const listing = await Listing.create(
    {
      sellerId,
      workshopId: workshops[unit.seller] ?? null,
      status,
      category: unit.category,
      maker: unit.maker,
      model: unit.model,
      yearFrom: unit.years[0],
      yearTo: unit.years[1],
      serialNumber: unit.serial,
      mainsVoltageV: unit.mains?.v ?? null,
      mainsFrequencyHz: unit.mains?.hz ?? null,
      mainsSwitchable: unit.mains?.switchable ?? false,
      weightG: Math.round(unit.weightKg * 1000),
      boxedLengthMm: unit.box[0] * 10,
      boxedWidthMm: unit.box[1] * 10,
      boxedHeightMm: unit.box[2] * 10,
      includesManual: unit.includes?.includes("manual") ?? false,
      includesRemote: unit.includes?.includes("remote") ?? false,
      includesOriginalPacking: unit.includes?.includes("packing") ?? false,
      priceMinor: unit.price * 100,
      currency: unit.currency ?? "GBP",
      offersWelcome: unit.offers ?? false,
      country: "GB",
      region: place.region,
      town: place.town,
      postcode: place.postcode,
      shippingOptions: shippingFor(unit, place.town),
      handlingDays: unit.handlingDays ?? 3,
      cosmeticGrade: unit.grade,
      serviceState: unit.service,
      conditionNote: unit.note,
      benchVerified: status === "draft" ? false : state.benchVerified,
      publishedAt: status === "draft" ? null : publishedAt,
      heldReason: status === "held" ? state.heldReason : null,
      ...listingFacets(sheet),
    },
    { transaction: t },
  );
  if (sheet) {
    await BenchSheet.create(
      {
        listingId: listing.id,
        sheet,
        verdict,
        checkedAt: publishedAt,
      },
      { transaction: t },
    );
  }
  for (const entry of unit.log ?? []) {
    await RestorationEntry.create(
      {
        listingId: listing.id,
        doneOn: new Date(Date.now() - entry.daysAgo * DAY).toISOString().slice(0, 10),
        work: entry.work,
        parts: entry.parts ?? [],
        technician: entry.technician ?? null,
        readingsBefore: entry.before ?? [],
        readingsAfter: entry.after ?? [],
      },
      { transaction: t },
    );
  }
  for (const [position, p] of photos.entries()) {
    await ListingPhoto.create(
      {
        listingId: listing.id,
        position,
        isCover: position === 0,
        status: "ready",
        originalKey: p.originalKey,
        thumbKey: p.thumbKey,
        listingKey: p.listingKey,
        zoomKey: p.zoomKey,
        contentType: "image/jpeg",
        byteSize: p.byteSize,
        width: p.width,
        height: p.height,
        phash: p.phash,
        error: null,
      },
      { transaction: t },
    );
  }
  return true;
}
