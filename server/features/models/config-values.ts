/** Small readers for untrusted JSON values. */
export type Json = Record<string, unknown>;
export const num = (v: unknown) => (typeof v === "number" && Number.isFinite(v) ? v : undefined);
export const isObj = (v: unknown): v is Json => typeof v === "object" && v !== null && !Array.isArray(v);
export type Warn = (code: string, message: string, fix: string) => void;
