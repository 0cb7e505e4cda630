// Shared look for the stand-ins' own pages (mail inbox, sign-in, payment, onboarding): Loadline's
// warm paper and dark ink, plus a clear band saying this is a local stand-in, not the real service.

export function escapeHtml(value: string): string {
  return value.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;").replace(/'/g, "&#39;");
}

/** Tagged template that escapes every interpolation except values wrapped with `raw()`. */
export function html(strings: TemplateStringsArray, ...values: unknown[]): Raw {
  let out = strings[0];
  values.forEach((v, i) => {
    out += render(v) + strings[i + 1];
  });
  return new Raw(out);
}

export class Raw {
  constructor(readonly value: string) {}
  toString(): string {
    return this.value;
  }
}
export const raw = (value: string) => new Raw(value);

function render(v: unknown): string {
  if (v instanceof Raw) return v.value;
  if (Array.isArray(v)) return v.map(render).join("");
  if (v === false || v === null || v === undefined) return "";
  if (typeof v === "string" || typeof v === "number" || typeof v === "boolean") return escapeHtml(String(v));
  return escapeHtml(JSON.stringify(v));
}

const styles = `
:root { --paper:#f6f1e7; --card:#fffdf8; --ink:#221d17; --muted:#6b6153; --line:#d9cfbd;
  --walnut:#6b4226; --brass:#b08a3e; --trace:#2f6b4f; --alarm:#a23b2a; }
* { box-sizing: border-box; }
body { margin:0; background:var(--paper); color:var(--ink);
  font: 16px/1.5 system-ui, -apple-system, "Segoe UI", sans-serif; }
.band { background:var(--ink); color:var(--paper); font-size:13px; padding:6px 16px; letter-spacing:.02em; }
.band b { color:#e6cf9a; font-weight:600; }
main { max-width: 960px; margin: 0 auto; padding: 24px 16px 48px; }
main.narrow { max-width: 460px; }
h1 { font-family: Georgia, "Source Serif 4", serif; font-weight:600; font-size:28px; margin:0 0 4px; }
h2 { font-family: Georgia, "Source Serif 4", serif; font-weight:600; font-size:20px; margin:24px 0 8px; }
p.lede { color:var(--muted); margin:0 0 20px; }
a { color:var(--walnut); }
.card { background:var(--card); border:1px solid var(--line); border-radius:10px; padding:20px; }
label { display:block; font-weight:600; font-size:14px; margin:14px 0 4px; }
input[type=text], input[type=email], input:not([type]) { width:100%; padding:10px 12px; font:inherit;
  border:1px solid var(--line); border-radius:6px; background:#fff; color:var(--ink); }
input:focus, button:focus, a:focus { outline:3px solid var(--brass); outline-offset:1px; }
.row { display:flex; gap:12px; } .row > div { flex:1; }
button, .button { display:inline-block; margin-top:18px; padding:10px 18px; font:inherit; font-weight:600;
  background:var(--walnut); color:#fff; border:0; border-radius:6px; cursor:pointer; text-decoration:none; }
button.quiet, .button.quiet { background:transparent; color:var(--walnut); border:1px solid var(--walnut); }
.error { color:var(--alarm); font-weight:600; margin:12px 0 0; }
.ok { color:var(--trace); font-weight:600; }
.muted { color:var(--muted); font-size:14px; }
.mono, code { font-family: ui-monospace, "JetBrains Mono", monospace; font-variant-numeric: tabular-nums; }
table { width:100%; border-collapse:collapse; background:var(--card); border:1px solid var(--line); }
th, td { text-align:left; padding:8px 10px; border-bottom:1px solid var(--line); vertical-align:top; font-size:15px; }
th { font-size:13px; color:var(--muted); font-weight:600; }
tr:hover td { background:#fbf6ea; }
.chips { display:flex; flex-wrap:wrap; gap:8px; margin-top:8px; }
.chips button { margin:0; padding:6px 10px; font-size:14px; font-weight:500; background:#efe6d3; color:var(--ink);
  border:1px solid var(--line); }
dl { display:grid; grid-template-columns: max-content 1fr; gap:4px 16px; margin:0; }
dt { color:var(--muted); font-size:14px; } dd { margin:0; word-break:break-word; }
pre { white-space:pre-wrap; word-break:break-word; background:var(--card); border:1px solid var(--line);
  border-radius:8px; padding:14px; font-size:14px; }
iframe { width:100%; min-height:260px; border:1px solid var(--line); border-radius:8px; background:#fff; }
.total { font-size:32px; font-weight:700; }
`;

export function page(opts: { title: string; service: string; body: Raw; narrow?: boolean; head?: Raw }): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(opts.title)}</title><style>${styles}</style>${opts.head?.value ?? ""}</head>
<body><div class="band"><b>Loadline local stand-in</b> · ${escapeHtml(opts.service)} · nothing here reaches a real service</div>
<main${opts.narrow ? ' class="narrow"' : ""}>${opts.body.value}</main></body></html>`;
}
