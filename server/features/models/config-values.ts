/** Small readers for untrusted JSON values. */
import type { JsonObject } from "../../../shared/json-values";

export { isObj } from "../../../shared/json-values";
export type Json = JsonObject;
/**
 * Finite numbers only, unlike shared/json-values' `num`: an import must not store a value such as 1e999 (JSON.parse
 * reads it as Infinity), while an export target's reader takes whatever json.load would hand the consumer.
 */
export const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : undefined);
export type Warn = (code: string, message: string, fix: string) => void;
