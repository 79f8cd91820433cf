import { doublePrecision, integer, pgTable, serial, text, timestamp } from "drizzle-orm/pg-core";
import { users } from "./users";

/** The infra catalog: dense peak FLOP/s at the training precision, memory and hourly price per accelerator. */
export const accelerators = pgTable("accelerators", {
  id: serial("id").primaryKey(),
  name: text("name").notNull().unique(),
  memoryBytes: doublePrecision("memory_bytes").notNull(),
  peakFlops: doublePrecision("peak_flops").notNull(),
  pricePerHour: doublePrecision("price_per_hour").notNull(),
  notes: text("notes").notNull().default(""),
  createdBy: integer("created_by").references(() => users.id),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  /** Set when an accelerator that plans were costed on is taken out of the catalog: hidden from pickers, never deleted. */
  retiredAt: timestamp("retired_at", { withTimezone: true }),
});
