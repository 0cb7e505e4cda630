/** The id of the (empty) form the capture inputs belong to; it sits outside the sheet's form so the two never mix. */
export const CAPTURE_FORM_ID = "capture-form";
/** The plain form that adds a finished capture's readings to the sheet (after a long analysis). */
export const CAPTURE_ADD_FORM_ID = "capture-add-form";

/** What a capture may hold, as the capture form offers it (the API's `kind`). */
export const CAPTURE_KINDS = ["sine", "square", "sweep", "impedance", "separation", "imd", "output_impedance", "wow_flutter"] as const;
export type CaptureKind = (typeof CAPTURE_KINDS)[number];

/** The capture just posted by the plain form (`?capture=<id>`), as the bench step shows it. */
export type PostedCaptureView = {
  id: string;
  fileName: string;
  status: "queued" | "running" | "done" | "failed";
  readings: string[];
  sweepPoints: number | null;
  message: string | null;
  onSheet: boolean;
};

/** What the plain-form capture path hands the bench step: the posted capture, a refusal, the kind asked for. */
export type CaptureFormState = {
  posted: PostedCaptureView | null;
  failure: { message: string; issues: string[] } | null;
  kind: CaptureKind | null;
};
