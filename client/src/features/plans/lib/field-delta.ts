/**
 * The "Change" column of the side-by-side view: for two numbers, the difference and the ratio (a context going from
 * 32,768 to 131,072 reads "+98,304 · ×4"); for anything else, whether the value was set, cleared or replaced.
 */
const grouped = new Intl.NumberFormat("en-US", { maximumSignificantDigits: 6 });
// Stored inputs are shown in full (15 digits is what a double keeps exactly), only grouped for reading.
const exact = new Intl.NumberFormat("en-US", { maximumSignificantDigits: 15 });

const signed = (n: number) => `${n > 0 ? "+" : n < 0 ? "−" : "±"}${grouped.format(Math.abs(n))}`;

export function fieldDelta(was: unknown, now: unknown): string {
  const absent = (v: unknown) => v === null || v === undefined;
  if (absent(was) && !absent(now)) return "set";
  if (!absent(was) && absent(now)) return "cleared";
  if (typeof was === "number" && typeof now === "number") {
    const diff = signed(now - was);
    // A ratio only means something between two non-zero figures of the same sign.
    if (was === 0 || now === 0 || Math.sign(was) !== Math.sign(now)) return diff;
    return `${diff} · ×${grouped.format(Number((now / was).toPrecision(4)))}`;
  }
  return "replaced";
}

/** A stored value in words for the table: absent is a dash, objects as compact JSON. */
export function showValue(v: unknown): string {
  if (v === null || v === undefined) return "—";
  if (typeof v === "number") return exact.format(v);
  return typeof v === "object" ? JSON.stringify(v) : String(v);
}
