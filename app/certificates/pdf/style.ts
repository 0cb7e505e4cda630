// The certificate's colours: app/app.css's palette, so the paper reads as Loadline's own pages do.
export const COLOURS = {
  ink: "#1f1a15",
  inkSoft: "#4a4037",
  inkFaint: "#6b5f52",
  rule: "#dcd1bd",
  ruleStrong: "#c2b49b",
  paper: "#fcfaf5",
  walnut: "#6a4127",
  brass: "#b48f3e",
  brassInk: "#7a5c17",
  brassWash: "#f6ecd3",
  trace: "#2e6a4e",
  traceWash: "#e1eee5",
  fault: "#9a3b2e",
  faultWash: "#f6e2dc",
} as const;
