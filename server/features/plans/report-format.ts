/** Text formatting shared by the budget sections of the report (budget model 1 and 2 print the same way). */
export const esc = (v: unknown) =>
  String(v ?? "").replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]!);
export const sci = (v: number) =>
  Math.abs(v) >= 1e6 ? v.toExponential(3) : v.toLocaleString("en-US", { maximumFractionDigits: 2 });
export const gib = (b: number) => `${(b / 2 ** 30).toFixed(2)} GiB`;
