import { randomBytes, randomUUID } from "node:crypto";
import { checkBenchSheet, exampleIntegratedAmplifierSheet, type BenchSheet as Sheet } from "@shared/bench";
import { listingFacets } from "@shared/listing-facets";
import { analyseSine, analyseSquare, parseTwoColumnCsv, SQUARE_COLUMNS } from "@shared/bench/analysis";
import { BenchSheet, Listing, ListingPhoto, RestorationEntry, User, Workshop } from "~/models/index.server";
import { Capture } from "~/models/capture.server";
import { Watch } from "~/models/watch.server";
import type { Role } from "~/auth/roles";
import type { ListingStatus } from "@shared/catalogue";
import { singlePoleSquareCsv, toneSamples } from "./capture-files";

// A restored integrated amplifier as a workshop would list it, for the listing-page suites: a verified
// workshop, a bench sheet whose distortion comes from two sine captures and whose rise time comes from
// a square-wave capture, a flat response sweep, restoration log, photos and shipping. All invented.

export const FIXTURE_RUN = randomBytes(4).toString("hex");
export const FIXTURE_SERIAL = `TA6200-SN-${FIXTURE_RUN}-0042`;

export async function makeUser(label: string, roles: Role[] = ["buyer"]): Promise<User> {
  return User.create({
    email: `listing-it-${FIXTURE_RUN}-${label}@example.test`,
    displayName: `Listing test ${label}`,
    passwordHash: null,
    emailVerifiedAt: new Date(),
    lastSignInAt: null,
    roles,
  });
}

export interface AmplifierFixture {
  seller: User;
  workshop: Workshop;
  listing: Listing;
  captures: { left: Capture; right: Capture; square: Capture };
  squareCsv: string;
}

/** A sine capture row analysed here, as the capture job would have stored it (its file is not needed by the page). */
async function sineCapture(ownerId: string, channel: "left" | "right", h3: number): Promise<Capture> {
  const fs = 48_000;
  // Full scale is 2 V rms at the analyser behind a 20:1 divider (56.6 V peak at the output):
  // 0.548 of it is 31 V peak, 21.9 V rms, 60 W into 8 Ω.
  const x = toneSamples({
    sampleRate: fs,
    seconds: 1,
    f0: 1000,
    harmonics: [1, 0.00005, h3, 0.00002, 0.00001],
    peak: 0.5477,
    noiseRms: 1e-6,
  });
  const conditions = {
    kind: "sine" as const,
    scale: { kind: "analyser" as const, fullScaleVolts: 2, basis: "rms" as const, attenuation: 20 },
    loadOhm: 8,
    fundamentalHz: 1000,
    channel,
    weighting: "unweighted" as const,
    window: "blackman-harris-7" as const,
  };
  const analysis = analyseSine([x], fs, { scale: conditions.scale, loadOhms: 8, fundamentalHz: 1000 }, ["mono"]);
  return Capture.create({
    ownerId,
    kind: "sine",
    status: "done",
    fileName: `bench-${channel}-${FIXTURE_RUN}.wav`,
    contentType: "audio/wav",
    byteSize: fs * 3,
    storageKey: `captures/test/${randomUUID()}.wav`,
    format: { file: "wav", container: "RIFF", encoding: "pcm", bitDepth: 24, channels: 1, sampleRate: fs, frames: fs, durationS: 1 },
    conditions,
    analysis,
    readings: [],
    finishedAt: new Date(),
  });
}

export async function createAmplifierListing(
  opts: {
    status?: ListingStatus;
    heldReason?: string;
    weightG?: number;
    /** Stores the square-wave CSV in object storage (the page reads it to draw the trace). */
    putObject?: (key: string, body: string) => Promise<void>;
    label?: string;
  } = {},
): Promise<AmplifierFixture> {
  const label = opts.label ?? "amp";
  const seller = await makeUser(`${label}-seller`, ["buyer", "workshop"]);
  const workshop = await Workshop.create({
    ownerId: seller.id,
    name: `Kestrel Lane Workshop ${FIXTURE_RUN}`,
    slug: `kestrel-lane-${FIXTURE_RUN}-${label}`.toLowerCase(),
    country: "DE",
    region: "Vorland",
    town: "Altmarkhafen",
    about: "Two benches, one scope, forty years of amplifiers.",
    verificationStatus: "verified",
    verifiedAt: new Date(),
  });

  const left = await sineCapture(seller.id, "left", 0.00011);
  const right = await sineCapture(seller.id, "right", 0.00013);
  const squareCsv = singlePoleSquareCsv({ f3dB: 95_000, period: 1e-4, dt: 2e-8, cycles: 2, low: -0.5, high: 0.5 });
  const cols = parseTwoColumnCsv(squareCsv, SQUARE_COLUMNS);
  const squareKey = `captures/test/${randomUUID()}.csv`;
  if (opts.putObject) await opts.putObject(squareKey, squareCsv);
  const square = await Capture.create({
    ownerId: seller.id,
    kind: "square",
    status: "done",
    fileName: `square-${FIXTURE_RUN}.csv`,
    contentType: "text/csv",
    byteSize: squareCsv.length,
    storageKey: squareKey,
    format: { file: "csv", rows: cols.x.length, header: ["time", "volts"] },
    conditions: { kind: "square", channel: "left", loadOhm: 8, frequencyHz: 10_000 },
    analysis: analyseSquare(cols.x, cols.y),
    readings: [],
    finishedAt: new Date(),
  });

  const sheet: Sheet = exampleIntegratedAmplifierSheet();
  sheet.equipment = { ...sheet.equipment, serial: FIXTURE_SERIAL };
  const ids: Record<string, string> = { cap_demo_1k_left: left.id, cap_demo_1k_right: right.id, cap_demo_square_10k: square.id };
  sheet.readings = sheet.readings.map((r) => (r.captureId && ids[r.captureId] ? { ...r, captureId: ids[r.captureId] } : r));
  sheet.sweeps = [
    {
      kind: "flat",
      channel: "left",
      origin: "typed",
      conditions: { loadOhm: 8, powerW: 1 },
      points: [10, 20, 50, 100, 1000, 10_000, 20_000, 50_000, 95_000].map((f) => ({
        frequencyHz: f,
        // Single-pole corners at 7 Hz and 95 kHz, as the sheet's −3 dB readings say.
        levelDb: -10 * Math.log10(1 + (7 / f) ** 2) - 10 * Math.log10(1 + (f / 95_000) ** 2),
      })),
    },
  ];
  const verdict = checkBenchSheet(sheet);
  const status = opts.status ?? "live";
  const listing = await Listing.create({
    sellerId: seller.id,
    workshopId: workshop.id,
    status,
    category: "integrated_amplifier",
    maker: "Tallowmere Audio",
    model: "Ostry 60",
    yearFrom: 1979,
    yearTo: 1979,
    serialNumber: FIXTURE_SERIAL,
    mainsVoltageV: 230,
    mainsFrequencyHz: 50,
    mainsSwitchable: true,
    weightG: opts.weightG ?? 14_200,
    boxedLengthMm: 560,
    boxedWidthMm: 480,
    boxedHeightMm: 260,
    includesManual: true,
    priceMinor: 145_000,
    currency: "EUR",
    offersWelcome: true,
    country: "DE",
    region: "Vorland",
    town: "Altmarkhafen",
    postcode: "99901",
    shippingOptions: [
      { method: "collection" },
      { method: "parcel", prices: { domestic: 3900, nearby: 6900 } },
      { method: "freight", prices: { domestic: 9500, nearby: 14_500, worldwide: 42_000 } },
    ],
    handlingDays: 3,
    cosmeticGrade: "clean",
    serviceState: "serviced_measured",
    conditionNote: "Faint hairline on the top cover; front panel and knobs clean.",
    benchVerified: verdict.benchVerified,
    publishedAt: status === "draft" ? null : new Date(),
    heldReason: status === "held" ? (opts.heldReason ?? "Power into 4 Ω is implausible for these rails.") : null,
    ...listingFacets(sheet),
  });
  await BenchSheet.create({ listingId: listing.id, sheet, verdict, checkedAt: new Date() });
  await RestorationEntry.bulkCreate([
    {
      listingId: listing.id,
      doneOn: "2025-02-20",
      work: "Recapped the power supply and driver boards; cleaned the input selector and speaker relay.",
      parts: [
        { part: "Filter capacitor 10 000 µF 63 V", quantity: 2, reference: "C901, C902" },
        { part: "Electrolytic capacitor, driver board", quantity: 14 },
      ],
      technician: "M. Farrowdale",
      readingsBefore: [{ quantity: "DC offset, left", value: 48, unit: "mV", conditions: "no input, 8 Ω load" }],
      readingsAfter: [{ quantity: "DC offset, left", value: 4, unit: "mV", conditions: "no input, 8 Ω load" }],
    },
    {
      listingId: listing.id,
      doneOn: "2025-03-14",
      work: "Set idle bias after two hours' warm-up; full bench measurement.",
      parts: [{ part: "Bias trimmer 500 Ω", quantity: 2, reference: "VR401, VR402" }],
      technician: "M. Farrowdale",
      readingsBefore: [],
      readingsAfter: [{ quantity: "Idle current per channel", value: 32, unit: "mA", conditions: "after 2 h warm-up" }],
    },
  ]);
  await ListingPhoto.bulkCreate(
    [0, 1].map((i) => ({
      listingId: listing.id,
      position: i,
      isCover: i === 0,
      status: "ready",
      originalKey: `originals/photos/2026/01/${randomUUID()}.jpg`,
      thumbKey: `photos/thumb/2026/01/${randomUUID()}.jpg`,
      listingKey: `photos/listing/2026/01/${randomUUID()}.jpg`,
      zoomKey: `photos/zoom/2026/01/${randomUUID()}.jpg`,
      contentType: "image/jpeg",
      byteSize: 1000,
      width: 1024,
      height: 768,
      // A random hash: identical ones on two sellers' listings would read as a copied photo at publish.
      phash: randomBytes(8).toString("hex"),
    })) as never,
  );
  return { seller, workshop, listing, captures: { left, right, square }, squareCsv };
}

/** Removes every row the fixtures made for these users (listings cascade to sheets, photos, log, watches). */
export async function removeFixtureUsers(users: User[]) {
  const ids = users.map((u) => u.id);
  await Watch.destroy({ where: { userId: ids } });
  await Listing.destroy({ where: { sellerId: ids } });
  await Workshop.destroy({ where: { ownerId: ids } });
  await Capture.destroy({ where: { ownerId: ids } });
  await User.destroy({ where: { id: ids } });
}
