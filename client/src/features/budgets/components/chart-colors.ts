/** Stage colours from the palette (index.css tokens), repeated past six stages. */
const STAGE_COLORS = [
  "var(--color-hemp)",
  "var(--color-seaglass)",
  "var(--color-hemp-light)",
  "var(--color-seaglass-dark)",
  "var(--color-hemp-dark)",
  "var(--color-ink-soft)",
];

export const stageColor = (index: number) => STAGE_COLORS[index % STAGE_COLORS.length];

/** Context lengths as people say them: 32768 → "32k" (k = 1024), otherwise the number. */
export function formatLength(tokens: number): string {
  if (tokens >= 1024 && tokens % 1024 === 0)
    return tokens >= 1024 ** 2 && tokens % 1024 ** 2 === 0 ? `${tokens / 1024 ** 2}M` : `${tokens / 1024}k`;
  return tokens >= 10_000 ? `${Math.round(tokens / 1024)}k` : String(Math.round(tokens));
}
