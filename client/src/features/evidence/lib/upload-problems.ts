/**
 * A refused upload in plain sentences. The server names where each problem is (issue 12: "a 400 naming the row and
 * column"): field keys such as "row 3, column trials", "row 1" (the header), "file", "kind", "fingerprint" or
 * "provenance.buckets.0.minTokens"; the message says what is wrong there.
 */
type Refusal = { status: number; code: string; message: string; fields?: Record<string, string> };

const sentence = (text: string) => {
  const t = text.trim();
  const s = t.charAt(0).toUpperCase() + t.slice(1);
  return /[.!?]$/.test(s) ? s : `${s}.`;
};

/** Where the problem is, as a reader says it. */
function place(key: string): string {
  const cell = /^row (\d+), column (.+)$/.exec(key);
  if (cell) return `Row ${cell[1]}, column ${cell[2]}`;
  if (key === "row 1") return "Row 1 (the header)";
  const row = /^row (\d+)$/.exec(key);
  if (row) return `Row ${row[1]}`;
  if (key === "provenance") return "The provenance";
  if (key.startsWith("provenance.")) return `The provenance's ${key.slice("provenance.".length)}`;
  if (key === "kind") return "The kind";
  if (key === "fingerprint") return "The fingerprint";
  return `The ${key}`;
}

/** What the file part's terse field text means, said whole. */
function fileSentence(text: string, message: string): string {
  if (text === "missing") return "Choose a results file to upload.";
  if (text.startsWith("larger than")) return `The file is ${text}.`;
  if (/^(the file|the results|results\.)/i.test(text)) return sentence(text);
  // The server's message is the whole sentence when the field carries a short tag ("too large", "no data rows").
  return sentence(message.length > text.length ? message : `the file: ${text}`);
}

export function uploadProblems(e: Refusal): string[] {
  if (e.code === "fingerprint_mismatch")
    return [
      `Not stored: ${sentence(e.message)}`,
      "Evidence must come from a model rigged exactly as this revision plans; run the evaluation on that model, or check the fingerprint you pasted.",
    ];
  if (e.code === "not_approved") return [`Not stored: ${sentence(e.message)}`];
  const fields = Object.entries(e.fields ?? {});
  if (!fields.length) return [sentence(e.message)];
  return fields.map(([key, text]) => {
    if (key === "file") return fileSentence(text, e.message);
    // Schema checks already answer a sentence naming the field (shared/validation-messages.ts): keep it whole, and
    // say when the field lives inside the provenance JSON.
    if (!key.startsWith("row ") && /^[A-Z][^]*[.!?]$/.test(text.trim()))
      return key.startsWith("provenance.") ? `In the provenance: ${text.trim()}` : text.trim();
    return `${place(key)}: ${sentence(text)}`;
  });
}
