import { sql } from "drizzle-orm";
import { boolean, doublePrecision, index, integer, jsonb, pgTable, serial, text, timestamp } from "drizzle-orm/pg-core";
import { users } from "./users";

export const modelProfiles = pgTable(
  "model_profiles",
  {
    id: serial("id").primaryKey(),
    name: text("name").notNull().unique(),
    family: text("family").notNull(),
    headDim: integer("head_dim").notNull(),
    partialRotaryFactor: doublePrecision("partial_rotary_factor").notNull().default(1),
    ropeTheta: doublePrecision("rope_theta").notNull(),
    trainedContext: integer("trained_context").notNull(),
    maxPositionEmbeddings: integer("max_position_embeddings"),
    /** Lineage: the length served now, when it differs from the pre-trained trainedContext (shared/lineage.ts). */
    servedContext: integer("served_context"),
    layers: integer("layers").notNull(),
    attentionHeads: integer("attention_heads").notNull(),
    kvHeads: integer("kv_heads").notNull(),
    hiddenSize: integer("hidden_size").notNull(),
    parameters: doublePrecision("parameters").notNull(),
    parametersTotal: doublePrecision("parameters_total"),
    bytesPerElement: doublePrecision("bytes_per_element").notNull().default(2),
    provenance: text("provenance").notNull().default(""),
    currentScaling: jsonb("current_scaling"),
    /** Per-layer-type rotary settings (shared/schemas/models.ts layerGroupSchema); null = one full_attention group. */
    layerGroups: jsonb("layer_groups"),
    mropeSection: jsonb("mrope_section"),
    mropeInterleaved: boolean("mrope_interleaved").notNull().default(false),
    kvLatentDim: integer("kv_latent_dim"),
    sourceFileName: text("source_file_name"),
    sourceConfig: text("source_config"),
    importWarnings: jsonb("import_warnings").notNull().default([]),
    createdBy: integer("created_by").references(() => users.id),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    /** Set when a profile that plans use is taken out of the pickers; the plans keep working on it. */
    retiredAt: timestamp("retired_at", { withTimezone: true }),
  },
  (t) => [
    index("model_profiles_name_lower_idx").on(sql`lower(${t.name})`, t.id),
    index("model_profiles_name_trgm").using("gin", t.name.op("gin_trgm_ops")),
  ],
);
