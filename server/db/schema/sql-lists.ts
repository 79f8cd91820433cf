import { sql } from "drizzle-orm";

/** A constant SQL list of quoted literals from a shared tuple (values are our own constants, never input). */
export const inList = (values: readonly string[]) => sql.raw(values.map((v) => `'${v}'`).join(", "));
