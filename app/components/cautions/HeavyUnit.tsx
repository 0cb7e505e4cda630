import { TWO_PERSON_LIFT_G } from "@shared/catalogue";
import { CautionBox } from "./CautionBox";

export type HeavyUnitContext = "checkout" | "dispatch" | "arrival";

/** Whether a unit of this weight (grams) takes two people and freight: 30 kg and over. */
export function isHeavyUnit(weightG: number | null | undefined): boolean {
  return weightG != null && weightG >= TWO_PERSON_LIFT_G;
}

const kg = (g: number) => `${Math.round(g / 100) / 10} kg`;

/**
 * The two-person and freight cautions for units of 30 kg and over; renders nothing for lighter units.
 * `context`: the buyer choosing delivery, the seller packing, or the buyer taking delivery.
 */
export function HeavyUnit({
  weightG,
  context,
  className,
  headingLevel,
}: {
  weightG: number | null | undefined;
  context: HeavyUnitContext;
  className?: string;
  headingLevel?: 2 | 3 | 4;
}) {
  if (!isHeavyUnit(weightG)) return null;
  const weight = kg(weightG!);
  return (
    <CautionBox title={`Heavy unit (${weight}): two people and freight`} className={className} headingLevel={headingLevel}>
      {context === "dispatch" ? (
        <>
          <p>
            Pack it as freight: strapped to a pallet or double-boxed with firm foam on every side, transformers and heatsinks braced, feet
            off the floor of the box. Most parcel carriers refuse units this heavy.
          </p>
          <p>Two people lift it, with bent knees, holding the chassis, never the knobs, handles or front panel.</p>
        </>
      ) : (
        <>
          <p>
            {context === "checkout"
              ? "It travels as freight on a pallet, not as a parcel. Have two people ready to take delivery and carry it in."
              : "Two people carry it in and unpack it, with bent knees, holding the chassis, never the knobs, handles or front panel."}
          </p>
          <p>Keep the packing until the audition window closes: a unit this heavy goes back the same way if it must.</p>
        </>
      )}
      <p>Follow your carrier's and your local rules for lifting and freight.</p>
    </CautionBox>
  );
}
