import { CautionBox } from "./CautionBox";

/**
 * Shown before a buyer switches on or measures a unit that has just arrived. Mains-powered gear can kill
 * and a careless test can destroy the amplifier being auditioned; we defer to technicians and local rules.
 */
export function ReceivingSafely({ className, headingLevel }: { className?: string; headingLevel?: 2 | 3 | 4 }) {
  return (
    <CautionBox title="Before you switch on or measure" tone="fault" className={className} headingLevel={headingLevel}>
      <ul className="list-disc space-y-1 pl-5">
        <li>
          <strong className="text-ink">Check the mains voltage.</strong> Set the voltage selector (or confirm the transformer's rating on
          the back panel) for your supply before you plug in; a unit set for a lower voltage can be ruined in seconds.
        </li>
        <li>
          <strong className="text-ink">Let a cold unit stand.</strong> After a cold journey, leave it unpacked at room temperature for
          several hours before switching on, so condensation inside can dry.
        </li>
        <li>
          <strong className="text-ink">Use a proper dummy load</strong> for power tests: non-inductive resistors of the right resistance,
          rated for the full power, with room to shed their heat. Loudspeakers are not dummy loads.
        </li>
        <li>
          <strong className="text-ink">Never short an output or connect it to ground.</strong> Bridged and floating outputs must not share
          the analyser's ground; many amplifiers have no output protection.
        </li>
        <li>
          <strong className="text-ink">Capacitors stay charged</strong> long after unplugging, and valve equipment runs at several hundred
          volts. Do not open the case.
        </li>
        <li>
          If in doubt, ask a <strong className="text-ink">qualified technician</strong> to measure it, and follow your local
          electrical-safety rules.
        </li>
      </ul>
    </CautionBox>
  );
}
