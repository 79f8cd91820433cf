/** [3,4,5,9,11,12] → "3–5, 9, 11–12": pair indices as runs, so 40 flagged pairs fit on a line. */
export function formatPairRanges(indices: readonly number[]): string {
  const sorted = [...new Set(indices)].sort((a, b) => a - b);
  const runs: string[] = [];
  for (let i = 0; i < sorted.length; i++) {
    const start = sorted[i];
    while (i + 1 < sorted.length && sorted[i + 1] === sorted[i] + 1) i++;
    runs.push(start === sorted[i] ? String(start) : `${start}–${sorted[i]}`);
  }
  return runs.join(", ");
}
