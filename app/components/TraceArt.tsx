/**
 * The masthead's picture: a scope graticule with a clean sine in trace green and its first
 * harmonics' residue in brass — what a healthy amplifier looks like on the bench.
 */
export function TraceArt({ className }: { className?: string }) {
  const w = 360;
  const h = 240;
  const points: string[] = [];
  const residue: string[] = [];
  for (let i = 0; i <= 180; i++) {
    const x = (i / 180) * w;
    const t = (i / 180) * Math.PI * 4;
    points.push(`${x.toFixed(1)},${(h / 2 - Math.sin(t) * 78).toFixed(1)}`);
    residue.push(`${x.toFixed(1)},${(h * 0.82 - (Math.sin(3 * t) * 7 + Math.sin(2 * t) * 4)).toFixed(1)}`);
  }
  return (
    <svg viewBox={`0 0 ${w} ${h}`} className={className} role="img" aria-label="A sine wave on an oscilloscope graticule">
      <rect x="0.5" y="0.5" width={w - 1} height={h - 1} rx="10" fill="#1f2a23" stroke="#2e6a4e" strokeOpacity="0.5" />
      {Array.from({ length: 9 }, (_, i) => (
        <line
          key={`v${i}`}
          x1={(w / 10) * (i + 1)}
          y1="6"
          x2={(w / 10) * (i + 1)}
          y2={h - 6}
          stroke="#e1eee5"
          strokeOpacity={i === 4 ? 0.22 : 0.09}
        />
      ))}
      {Array.from({ length: 7 }, (_, i) => (
        <line
          key={`h${i}`}
          x1="6"
          y1={(h / 8) * (i + 1)}
          x2={w - 6}
          y2={(h / 8) * (i + 1)}
          stroke="#e1eee5"
          strokeOpacity={i === 3 ? 0.22 : 0.09}
        />
      ))}
      <polyline points={points.join(" ")} fill="none" stroke="#6fd19c" strokeWidth="2.4" strokeLinejoin="round" />
      <polyline points={residue.join(" ")} fill="none" stroke="#d9b35f" strokeWidth="1.6" strokeOpacity="0.85" />
      <text x="14" y="24" fill="#e1eee5" fillOpacity="0.7" fontSize="11" fontFamily="JetBrains Mono, monospace">
        1 kHz · 8 Ω · 20 V/div
      </text>
      <text x="14" y={h - 14} fill="#d9b35f" fillOpacity="0.85" fontSize="11" fontFamily="JetBrains Mono, monospace">
        residue ×1000
      </text>
    </svg>
  );
}
