import { CautionBox } from "~/components/cautions/CautionBox";

// A reading on the bench sheet says the unit is unsafe to connect as it is (DC at a loudspeaker output, an
// oscillating output, a turntable far off speed): said plainly above the figures, with the usual cautions.

export function UnsafeToConnect({ hazards }: { hazards: { title: string; detail: string }[] }) {
  return (
    <CautionBox title="Unsafe to connect as it is" tone="fault" className="unsafe-to-connect">
      <ul className="list-disc space-y-1 pl-5">
        {hazards.map((h) => (
          <li key={h.title + h.detail}>
            <span className="font-medium text-ink">{h.title}:</span> {h.detail}
          </li>
        ))}
      </ul>
      <p>
        Do not connect this unit to loudspeakers, other equipment or the mains until a qualified technician has checked it. Mains voltage
        and charged capacitors stay inside after unplugging. Follow your local electrical-safety rules.
      </p>
    </CautionBox>
  );
}
