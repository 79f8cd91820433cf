/** Typed text → number; blank is "not given". Digit group separators (",", "_", spaces) are allowed; anything else gives NaN for the schema to name. */
export function parseNumberText(text: string): number | undefined {
  const t = text.trim().replace(/[,_\s]/g, "");
  return t === "" ? undefined : Number(t);
}
