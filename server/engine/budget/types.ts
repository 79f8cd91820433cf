/**
 * The budget engine's types come from the shared zod contract (shared/schemas/budget.ts), so the
 * engine, the router and the client read one definition. The engine only adds "resolved": the
 * service has replaced modelId / acceleratorId with concrete numbers.
 */
import type { z } from "zod";
import type {
  ACTIVATION_CHECKPOINTING,
  budgetAssumptionsSchema,
  budgetGrowthPointSchema,
  budgetStageEstimateSchema,
  budgetTotalsSchema,
  BudgetEstimateResponse,
  clusterSpecSchema,
  FLOP_CONVENTIONS,
  BudgetModelShape,
  LayerGroup,
  MEMORY_TERMS,
  ParsedBudgetEstimateRequest,
  StageRequest,
} from "../../../shared/schemas/budget";

export type FlopConvention = (typeof FLOP_CONVENTIONS)[number];
export type ActivationCheckpointing = (typeof ACTIVATION_CHECKPOINTING)[number];
export type MemoryTerm = (typeof MEMORY_TERMS)[number];
export type ModelShape = BudgetModelShape;
export type { LayerGroup };
export type ClusterSpec = z.output<typeof clusterSpecSchema>;
export type StageInput = StageRequest;

export type ResolvedBudgetInput = Omit<ParsedBudgetEstimateRequest, "model" | "cluster"> & {
  model: ModelShape;
  cluster: ClusterSpec;
};

export type StageEstimate = z.output<typeof budgetStageEstimateSchema>;
export type TrainingMemory = StageEstimate["trainingMemory"];
export type FitChange = NonNullable<StageEstimate["fitChange"]>;
export type BudgetTotals = z.output<typeof budgetTotalsSchema>;
export type GrowthPoint = z.output<typeof budgetGrowthPointSchema>;
export type BudgetAssumptions = z.output<typeof budgetAssumptionsSchema>;
export type BudgetEstimate = BudgetEstimateResponse;
