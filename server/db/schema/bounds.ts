import { bigint, doublePrecision, integer, jsonb, pgTable, primaryKey, text, timestamp } from "drizzle-orm/pg-core";

/**
 * Kept answers of the smallest-base search (POST /api/bounds/base with a targetContext). The answer depends only on
 * the key, so a repeated question is one lookup. A row with a null answer is a claim: one instance is computing it
 * and refreshes claimed_at while it does; a claim not refreshed for a few seconds is taken over (its owner died).
 */
export const baseSearchResults = pgTable(
  "base_search_results",
  {
    engineVersion: text("engine_version").notNull(),
    rotaryDim: integer("rotary_dim").notNull(),
    targetContext: bigint("target_context", { mode: "number" }).notNull(),
    gridFrom: doublePrecision("grid_from").notNull(),
    gridTo: doublePrecision("grid_to").notNull(),
    gridPerDecade: integer("grid_per_decade").notNull(),
    answer: jsonb("answer"),
    claimedAt: timestamp("claimed_at", { withTimezone: true }).notNull().defaultNow(),
    computedAt: timestamp("computed_at", { withTimezone: true }),
  },
  (t) => [
    primaryKey({
      name: "base_search_results_pk",
      columns: [t.engineVersion, t.rotaryDim, t.targetContext, t.gridFrom, t.gridTo, t.gridPerDecade],
    }),
  ],
);
