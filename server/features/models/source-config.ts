import type { ModelRow } from "./models.repo";

/** An imported profile's own config.json, so export readers see the model's real keys (layer types, rope_parameters …). */
export function sourceConfigOf(row: ModelRow): Record<string, unknown> | undefined {
  if (!row.sourceConfig) return undefined;
  try {
    const parsed: unknown = JSON.parse(row.sourceConfig);
    return typeof parsed === "object" && parsed !== null && !Array.isArray(parsed)
      ? (parsed as Record<string, unknown>)
      : undefined;
  } catch {
    return undefined; // the import accepted it, so this is only a stored file that no longer parses: use the profile
  }
}
