import type { SeriesPoint } from '@stillwell/shared/telemetry';

export interface ChartLine {
  label: string;
  colour: string;
  points: readonly SeriesPoint[];
}

export interface ChartRule {
  label: string;
  value: number;
  colour: string;
}

export interface ChartSpec {
  title: string;
  unit: string;
  from: number;
  to: number;
  lines: readonly ChartLine[];
  /** horizontal lines (thresholds); only those within reach of the data are drawn */
  rules?: readonly ChartRule[];
  /** x-axis labels */
  timeLabel: (ms: number) => string;
  width?: number;
  height?: number;
}

const PAD = { left: 52, right: 12, top: 26, bottom: 40 };

const esc = (s: string) =>
  s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/** Round tick steps (1, 2, 5 x 10^n) giving about `count` ticks over [lo, hi]. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  const span = hi - lo || Math.abs(hi) || 1;
  const raw = span / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
    out.push(+v.toFixed(10));
  return out;
}

/** The value range to draw: the data, and the rules that lie within a fifth of its span. */
export function valueRange(spec: ChartSpec): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const l of spec.lines)
    for (const p of l.points) {
      if (p.v < lo) lo = p.v;
      if (p.v > hi) hi = p.v;
    }
  if (lo === Infinity) return [0, 1];
  const reach = Math.max(hi - lo, 1) * 0.2;
  for (const r of spec.rules ?? [])
    if (r.value >= lo - reach && r.value <= hi + reach) {
      lo = Math.min(lo, r.value);
      hi = Math.max(hi, r.value);
    }
  const pad = (hi - lo || 1) * 0.05;
  return [lo - pad, hi + pad];
}

/**
 * A line chart as an SVG string (pdfmake draws SVG; no browser): axes with round ticks,
 * one polyline per series, dashed labelled rules for thresholds, a legend above.
 */
export function svgChart(spec: ChartSpec): string {
  const W = spec.width ?? 515;
  const H = spec.height ?? 210;
  const iw = W - PAD.left - PAD.right;
  const ih = H - PAD.top - PAD.bottom;
  const [lo, hi] = valueRange(spec);
  const span = Math.max(spec.to - spec.from, 1);
  const x = (t: number) => PAD.left + ((t - spec.from) / span) * iw;
  const y = (v: number) => PAD.top + ih - ((v - lo) / (hi - lo)) * ih;
  const f = (n: number) => n.toFixed(1);
  const out: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`,
    `<rect x="${PAD.left}" y="${PAD.top}" width="${iw}" height="${ih}" fill="#ffffff" stroke="#9e9e9e" stroke-width="0.6"/>`,
    `<text x="${PAD.left}" y="12" font-size="9" fill="#212121">${esc(spec.title)} (${esc(spec.unit)})</text>`,
  ];
  for (const v of niceTicks(lo, hi)) {
    if (v < lo || v > hi) continue;
    out.push(
      `<line x1="${PAD.left}" x2="${PAD.left + iw}" y1="${f(y(v))}" y2="${f(y(v))}" stroke="#e0e0e0" stroke-width="0.5"/>`,
      `<text x="${PAD.left - 4}" y="${f(y(v) + 3)}" font-size="7" text-anchor="end" fill="#424242">${+v.toFixed(3)}</text>`,
    );
  }
  const ticks = 6;
  for (let i = 0; i <= ticks; i += 1) {
    const t = spec.from + (span * i) / ticks;
    // the end labels are anchored inward so that neither is cut at the chart's edge
    const anchor = i === 0 ? 'start' : i === ticks ? 'end' : 'middle';
    out.push(
      `<line x1="${f(x(t))}" x2="${f(x(t))}" y1="${PAD.top + ih}" y2="${PAD.top + ih + 3}" stroke="#757575" stroke-width="0.5"/>`,
      `<text x="${f(x(t))}" y="${PAD.top + ih + 13}" font-size="7" text-anchor="${anchor}" fill="#424242">${esc(spec.timeLabel(t))}</text>`,
    );
  }
  for (const r of spec.rules ?? []) {
    if (r.value < lo || r.value > hi) continue;
    out.push(
      `<line x1="${PAD.left}" x2="${PAD.left + iw}" y1="${f(y(r.value))}" y2="${f(y(r.value))}" stroke="${r.colour}" stroke-width="0.8" stroke-dasharray="4,3"/>`,
      `<text x="${PAD.left + iw - 2}" y="${f(y(r.value) - 2)}" font-size="6.5" text-anchor="end" fill="${r.colour}">${esc(`${r.label} ${r.value}`)}</text>`,
    );
  }
  spec.lines.forEach((l, i) => {
    if (l.points.length) {
      const pts = l.points.map((p) => `${f(x(p.t))},${f(y(p.v))}`).join(' ');
      out.push(
        `<polyline points="${pts}" fill="none" stroke="${l.colour}" stroke-width="1.1" stroke-linejoin="round"/>`,
      );
    }
    const lx = PAD.left + i * 110;
    out.push(
      `<line x1="${lx}" x2="${lx + 14}" y1="${H - 8}" y2="${H - 8}" stroke="${l.colour}" stroke-width="2"/>`,
      `<text x="${lx + 18}" y="${H - 5}" font-size="7.5" fill="#212121">${esc(l.points.length ? l.label : `${l.label} (no readings)`)}</text>`,
    );
  });
  out.push('</svg>');
  return out.join('');
}
