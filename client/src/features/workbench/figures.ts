/** Number formats for the workbench's figures: significant figures, grouped integers, short tick labels. */

const grouped = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 0 });

const SUPERSCRIPT = "⁻⁰¹²³⁴⁵⁶⁷⁸⁹";
const superscript = (e: number) => String(e).replace(/[-0-9]/g, (c) => SUPERSCRIPT["-0123456789".indexOf(c)]);

/** n significant figures: plain from 10⁻³ up to 10⁶ (grouped from 1,000), "3.311 × 10⁷" outside. */
export function sig(value: number, n = 4): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return "0";
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-3) {
    const [mantissa, exponent] = value.toExponential(n - 1).split("e");
    return `${Number(mantissa)} × 10${superscript(Number(exponent))}`;
  }
  const fixed = Number(value.toPrecision(n));
  return abs >= 1000 ? grouped.format(fixed) : String(fixed);
}

/** Whole tokens, grouped: 262,144. */
export const tokens = (value: number) => grouped.format(Math.round(value));

/** Axis ticks: 10, 100, 1k, 10k, 1M. */
export function shortTick(value: number): string {
  const abs = Math.abs(value);
  if (abs >= 1e9) return `${Number((value / 1e9).toPrecision(3))}G`;
  if (abs >= 1e6) return `${Number((value / 1e6).toPrecision(3))}M`;
  if (abs >= 1e3) return `${Number((value / 1e3).toPrecision(3))}k`;
  return String(Number(value.toPrecision(3)));
}

/** 1-2-5 steps inside [lo, hi] (…0.1, 0.2, 0.5, 1, 2…), for log axes that span less than a few decades. */
export function oneTwoFive(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let e = Math.floor(Math.log10(lo)); e <= Math.ceil(Math.log10(hi)); e++) {
    for (const m of [1, 2, 5]) {
      const v = m * 10 ** e;
      if (v >= lo && v <= hi) out.push(Number(v.toPrecision(3)));
    }
  }
  return out;
}

/** Powers of ten inside [lo, hi], for log axes (d3's log ticks add every 2…9 in between). */
export function decades(lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let e = Math.ceil(Math.log10(lo)); e <= Math.floor(Math.log10(hi)); e++) out.push(10 ** e);
  return out;
}
