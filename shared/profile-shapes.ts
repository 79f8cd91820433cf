import type { ModelShape } from "./schemas/analysis";

/*
 * What each engine reads of a model profile, a revision's frozen snapshot of one, or a stored row. The server
 * (analyses, revision checks, frozen budgets) and the client (workbench, plan editor, plan budget sheet) all take
 * their shapes from here, so both sides ask the engines exactly the same question for the same profile.
 */

type SectionKeys = "mropeSection" | "mropeInterleaved";
type RotarySource = Required<Omit<ModelShape, "partialRotaryFactor" | SectionKeys>> & {
  partialRotaryFactor: number;
  /** a profile row's sections (null: none), or a snapshot's (absent: none) */
  mropeSection?: unknown;
  mropeInterleaved?: boolean | null;
};

/**
 * A profile's multimodal sections as the engine takes them: only when it has some, so the shape of every other model
 * (and what is computed from it) is as before.
 */
export const sectionsOf = (m: Pick<RotarySource, SectionKeys>): Pick<ModelShape, SectionKeys> =>
  Array.isArray(m.mropeSection) && m.mropeSection.length
    ? { mropeSection: m.mropeSection as number[], ...(m.mropeInterleaved ? { mropeInterleaved: true } : {}) }
    : {};

/** The rotary engine's model shape (the analysis schema is strict: only these keys). */
export const rotaryShapeOf = (m: RotarySource): ModelShape => ({
  headDim: m.headDim,
  ropeTheta: m.ropeTheta,
  trainedContext: m.trainedContext,
  partialRotaryFactor: m.partialRotaryFactor,
  layers: m.layers,
  attentionHeads: m.attentionHeads,
  kvHeads: m.kvHeads,
  hiddenSize: m.hiddenSize,
  ...sectionsOf(m),
});

/**
 * One layer group's rotary shape: its own base and rotary dimension over the profile's head shape. A group without
 * rotary positions (no_rope, ropeTheta null) or no group at all gives the profile's own shape. The workbench (group
 * picker), the plan checks and the frozen per-group results all ask the engine this one question.
 */
export const groupShape = (
  m: RotarySource,
  g: { ropeTheta: number | null; rotaryDim: number } | null | undefined,
): ModelShape => {
  const shape = rotaryShapeOf(m);
  if (!g || g.ropeTheta === null) return shape;
  return { ...shape, ropeTheta: g.ropeTheta, partialRotaryFactor: g.rotaryDim / m.headDim };
};

type BudgetSource = {
  parameters: number;
  layers: number;
  attentionHeads: number;
  kvHeads: number;
  headDim: number;
  hiddenSize: number;
  bytesPerElement: number;
};

/** The budget engine's model shape; the parameter count is whole (the estimate schema takes an integer count). */
export const budgetShapeOf = (m: BudgetSource) => ({
  parameters: Math.round(m.parameters),
  layers: m.layers,
  attentionHeads: m.attentionHeads,
  kvHeads: m.kvHeads,
  headDim: m.headDim,
  hiddenSize: m.hiddenSize,
  bytesPerElement: m.bytesPerElement,
});
