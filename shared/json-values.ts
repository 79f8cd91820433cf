/**
 * Small readers for values that came out of JSON (a config.json, a launch argument): written once here for the
 * engine's export targets and the server's config import.
 */
export type JsonObject = Record<string, unknown>;

/** A JSON object: not null, not an array. */
export const isObj = (v: unknown): v is JsonObject => typeof v === "object" && v !== null && !Array.isArray(v);

/** The number, or undefined for anything else (a consumer's reader takes what json.load hands it, finite or not). */
export const num = (v: unknown): number | undefined => (typeof v === "number" ? v : undefined);

/** The number, or `fallback` when the value is not one (Python's `config.get(key, fallback)` for a numeric key). */
export const numberOr = (v: unknown, fallback: number): number => num(v) ?? fallback;
