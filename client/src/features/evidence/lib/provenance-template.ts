/**
 * The provenance a harness run should report, prefilled so the researcher fills in values rather than remembering
 * keys. One bucket per length the criteria name; token counts start at 0, so a template sent unchanged marks those
 * criteria insufficient instead of passing them on faith.
 */
export function provenanceTemplate(lengths: number[]): string {
  const buckets = [...new Set(lengths)]
    .sort((a, b) => a - b)
    .map((contextLength) => ({ contextLength, meanTokens: 0, minTokens: 0 }));
  return JSON.stringify(
    {
      engine: "",
      engineVersion: "",
      tokenizer: "",
      chatTemplate: "none",
      truncation: "left",
      generationBudget: 32,
      buckets,
    },
    null,
    2,
  );
}
