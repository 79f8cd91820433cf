import type { Role } from "@shared/schemas/common";

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  researcher: "Researcher",
  infra: "Infra lead",
  approver: "Approver",
  viewer: "Viewer",
};

export const roleLabel = (role: Role) => ROLE_LABELS[role];

/** "Researcher, Approver and Viewer"; with "or" for alternatives: "admin or approver". */
export function formatList(items: readonly string[], joiner: "and" | "or" = "and"): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} ${joiner} ${items[items.length - 1]}`;
}

const dateFormat = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric" });

/** ISO timestamp → "3 Mar 2025"; anything unparseable is shown as given. */
export function formatDate(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateFormat.format(date);
}

// ---- figures: sensible precision with the unit beside the number ----

const grouped = new Intl.NumberFormat("en-GB", { maximumFractionDigits: 0 });
const SHORT_SCALE = [
  { at: 1e15, suffix: "quadrillion" },
  { at: 1e12, suffix: "trillion" },
  { at: 1e9, suffix: "billion" },
  { at: 1e6, suffix: "million" },
] as const;

/** Three significant figures, without a trailing ".0" ("1.25", "12.5", "125"). */
export function sig3(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return "0";
  return String(Number(value.toPrecision(3)));
}

/** 1 234 567 → "1.23 million"; below a million, grouped whole numbers ("65,536"). */
export function formatCount(value: number): string {
  const abs = Math.abs(value);
  for (const { at, suffix } of SHORT_SCALE) if (abs >= at) return `${sig3(value / at)} ${suffix}`;
  return abs >= 1000 || Number.isInteger(value) ? grouped.format(value) : sig3(value);
}

/** Every digit, grouped: a base of 50 000 000 reads "50,000,000" (not "50000000", nor a rounded "50 million"). */
export function formatGrouped(value: number): string {
  return Number.isInteger(value) ? grouped.format(value) : String(value);
}

/** A worst relative error as the conformance screens print it: "—" when there is none, "0", else 2 decimals in e-form. */
export const relativeErrorText = (e: number | null) => (e === null ? "—" : e === 0 ? "0" : e.toExponential(2));

/** Scientific notation with a superscript exponent: 3.12e21 → "3.12 × 10²¹". */
export function formatScientific(value: number): string {
  if (!Number.isFinite(value) || value === 0) return String(value);
  const exponent = Math.floor(Math.log10(Math.abs(value)));
  if (exponent >= -2 && exponent < 4) return sig3(value);
  const mantissa = Number((value / 10 ** exponent).toPrecision(3));
  // Rounding 9.995 up gives 10.0: carry into the exponent.
  const [m, e] = Math.abs(mantissa) >= 10 ? [mantissa / 10, exponent + 1] : [mantissa, exponent];
  const sup = String(e).replace(/[-0-9]/g, (c) => "⁻⁰¹²³⁴⁵⁶⁷⁸⁹"["-0123456789".indexOf(c)]);
  return `${sig3(m)} × 10${sup}`;
}

export const GIB = 2 ** 30;
/** FLOP/s in one TFLOP/s. */
export const TFLOPS = 1e12;
/** Bytes as binary units: "74.5 GiB", "512 KiB". */
export function formatBytes(bytes: number): string {
  const units = ["bytes", "KiB", "MiB", "GiB", "TiB", "PiB"];
  let value = bytes;
  let unit = 0;
  while (Math.abs(value) >= 1024 && unit < units.length - 1) {
    value /= 1024;
    unit += 1;
  }
  return unit === 0 ? `${grouped.format(value)} bytes` : `${sig3(value)} ${units[unit]}`;
}

/** Hours with sensible precision: "0.42 h", "12.3 h", "1,234 h". */
export function formatHours(hours: number): string {
  return `${hours >= 1000 ? grouped.format(hours) : sig3(hours)} h`;
}

/** An amount of money in the workspace's currency (no symbol: the catalog does not record one). */
/** An amount of money; with `currency` (the workspace's ISO code) the code follows it: "1,204 EUR". */
export function formatMoney(amount: number, currency?: string): string {
  const figure = amount >= 100 ? grouped.format(amount) : amount.toFixed(2);
  return currency ? `${figure} ${currency}` : figure;
}

const dateTimeFormat = new Intl.DateTimeFormat("en-GB", {
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
});

/** ISO timestamp → "3 Mar 2025, 14:05" (local time); anything unparseable is shown as given. */
export function formatDateTime(iso: string): string {
  const date = new Date(iso);
  return Number.isNaN(date.getTime()) ? iso : dateTimeFormat.format(date);
}

/** The first 12 hex digits of a SHA-256, enough to tell revisions apart on screen; the full hash stays in a title. */
export const shortHash = (hash: string) => `${hash.slice(0, 12)}…`;
