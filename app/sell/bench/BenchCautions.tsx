import { Caution } from "../Section";

/** The usual cautions for anyone measuring mains-powered gear, shown before the first reading. */
export function BenchCautions() {
  return (
    <Caution title="Before you measure: this work can kill or burn" tone="fault" className="text-[0.9375rem]">
      <ul className="list-disc space-y-1 pl-5">
        <li>
          <strong className="text-ink">Mains voltage</strong> is present inside with the lid off, and filter capacitors stay charged long
          after unplugging. Valve equipment runs at several hundred volts. Discharge and check with a meter before touching anything.
        </li>
        <li>
          <strong className="text-ink">Dummy loads and heatsinks get hot</strong> at full power; give them air and keep hands, cables and
          the bench clear.
        </li>
        <li>
          <strong className="text-ink">Never short or bridge outputs carelessly.</strong> Many amplifiers have no output protection, and
          bridged or floating outputs must not share the analyser's ground.
        </li>
        <li>
          Leave opening, repairing and measuring mains-powered units to a <strong className="text-ink">qualified technician</strong>.
          Selling used electrical goods is regulated in many places: follow your local electrical-safety rules.
        </li>
      </ul>
    </Caution>
  );
}
