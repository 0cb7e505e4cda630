import type { Category, CosmeticGrade, ServiceState } from "@shared/catalogue";
import type { Rng } from "./rng";

// Condition notes as sellers write them: a sentence on the state, one on what was done, one on the
// looks; some in the seller's own language, some with accented words, so text search meets both.

const STATE: Record<ServiceState, string[]> = {
  serviced_measured: [
    "Fully serviced on our bench and measured afterwards; the sheet shows the figures.",
    "Recapped, relays cleaned, bias and offset set, then measured into dummy loads.",
    "Serviced last month: new electrolytics in the supply, contacts cleaned, soak-tested for a week.",
    "Opened, cleaned and recalibrated; every function checked before listing.",
  ],
  working_unserviced: [
    "Works as it should in my system; never opened.",
    "Used daily until recently, all inputs work, a little crackle on the balance control.",
    "Working, unserviced: sounds fine, but expect it to need a service at some point.",
    "From a non-smoking home. Works, not serviced.",
  ],
  needs_work: [
    "One channel drops out once warm; probably the protection relay.",
    "Hum on both channels at any volume, likely the supply capacitors.",
    "Runs but needs attention: intermittent output and a noisy selector.",
    "Sold for repair: powers up, no sound from the left side.",
  ],
  parts_only: [
    "For parts or a full rebuild: does not power up.",
    "Incomplete and not working; good transformer and heatsinks.",
    "Parts only: water damage on the lower board.",
  ],
};

const CATEGORY_NOTES: Record<Category, string[]> = {
  integrated_amplifier: [
    "Phono input works with a moving-magnet cartridge.",
    "Tone controls and loudness clean.",
    "Speaker terminals replaced with new binding posts.",
  ],
  power_amplifier: ["Meters light evenly.", "Fan-less, runs warm at idle as it should.", "Pair of balanced inputs on the back."],
  receiver: ["Tuner locks on weak stations; dial lamps replaced.", "FM stereo lamp works.", "Dial cord restrung."],
  preamplifier: ["Both tape loops work.", "Volume track quiet at low levels.", "Headphone output works."],
  phono_stage: ["Loading switches clean.", "External supply included.", "Quiet with the gain turned up."],
  turntable: ["New belt fitted.", "Arm lift damped and even.", "Dust cover has fine hairlines.", "Cartridge not included."],
  tape_deck: ["Heads cleaned and demagnetised.", "Counter and auto-stop work.", "Pinch roller replaced."],
  loudspeaker: ["Surrounds refoamed.", "Grilles included, one with a small pull.", "Crossovers checked, no buzz at high level."],
};

const LOOKS: Record<CosmeticGrade, string[]> = {
  showroom: ["Looks close to new; original box and inserts.", "No marks under raking light.", "Exceptional cosmetics."],
  clean: ["Light marks on the top cover only.", "Front panel clean, knobs original.", "A few fine scratches you would have to look for."],
  lived_in: ["Scratches on the top and a faded legend or two.", "Honest wear from years of use.", "Small dent at the back corner."],
  rough: ["Deep scratches and a cracked foot.", "Heavy wear; one knob missing.", "Veneer lifting at one corner."],
};

// A touch of the trade's loanwords with their accents.
const ACCENTED = [
  "The façade is unmarked.",
  "Crème-coloured dial lamps, as original.",
  "A naïve first owner kept every receipt.",
  "Played mostly in a quiet café.",
  "Its rôle was the bedroom system.",
  "Déjà vu for anyone who owned one in the day.",
];

const LOCAL: Record<string, string[]> = {
  DE: ["Gepflegter Zustand, überprüft und gemessen.", "Kondensatoren getauscht, klingt hervorragend.", "Versand gut verpackt möglich."],
  AT: ["Gepflegter Zustand, überprüft und gemessen.", "Abholung in der Werkstätte möglich."],
  CH: ["Sehr schöner Zustand, revidiert.", "Abholung möglich, Versand nach Absprache."],
  FR: ["Très bon état, révisé et mesuré sur banc.", "Quelques rayures légères sur le capot.", "Envoi soigné, emballage d'origine."],
  BE: ["Très bon état, révisé.", "Remise en main propre possible."],
  ES: ["Revisado y medido, funciona perfectamente.", "Envío bien embalado."],
  IT: ["Revisionato, perfettamente funzionante.", "Spedizione con imballo accurato."],
  SE: ["Fint skick, servad och uppmätt.", "Kan hämtas på plats."],
  DK: ["Pæn stand, serviceret og målt.", "Kan afhentes."],
  NO: ["Pent brukt, overhalt og målt.", "Kan hentes."],
};

export function conditionNote(rng: Rng, category: Category, service: ServiceState, grade: CosmeticGrade, country: string): string {
  const parts = [rng.pick(STATE[service]), rng.pick(CATEGORY_NOTES[category]), rng.pick(LOOKS[grade])];
  if (rng.chance(0.25)) parts.push(rng.pick(ACCENTED));
  const local = LOCAL[country];
  if (local && rng.chance(0.45)) parts.unshift(rng.pick(local));
  return parts.join(" ");
}
