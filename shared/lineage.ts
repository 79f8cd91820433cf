import { findMethod } from "./methods";
import { methodParamsSchema, type MethodParams } from "./schemas/analysis";
import type { CurrentScaling } from "./schemas/models";

/*
 * Lineage: a model whose config already carries scaling was extended once before. It has two lengths (the one its
 * base was pre-trained at, and the one it is served at now) and a shipped method that took it from the first to the
 * second. The server (plan content, exports) and the client (plan editor, workbench) read them from here, so both
 * sides agree on what "as shipped" and "extends from the served length" mean. docs/model-layouts.md "Lineage".
 */

/** Which length a plan extends from: the pre-trained one (every plan before lineage existed) or the served one. */
export const EXTENDS_FROM = ["pretrained", "served"] as const;
export type ExtendsFrom = (typeof EXTENDS_FROM)[number];

export const AS_SHIPPED_LABEL = "As shipped";

/**
 * The config's own scaling as a method the engine runs: its parameters kept only where the catalog's form knows
 * them (a misspelt key in the file is warned about at import and not carried), then checked by the method's schema.
 * Null when the model runs unscaled or the block names a method or values the catalog cannot run.
 */
export function shippedMethod(cs: CurrentScaling | null | undefined): MethodParams | null {
  if (!cs) return null;
  const entry = findMethod(cs.method);
  if (!entry || entry.id === "default") return null;
  const candidate: Record<string, unknown> = { method: entry.id };
  for (const f of entry.fields)
    if (cs.params[f.key] !== undefined && cs.params[f.key] !== null) candidate[f.key] = cs.params[f.key];
  const parsed = methodParamsSchema.safeParse(candidate);
  return parsed.success ? parsed.data : null;
}

/** What a plan needs to know of a model's lineage; the lengths are tokens. */
export interface Lineage {
  pretrainedContext: number;
  servedContext: number;
}

/** The length a plan starts from. */
export const startLength = (l: Lineage, from: ExtendsFrom | undefined) =>
  from === "served" ? l.servedContext : l.pretrainedContext;

/**
 * The method as consumers read it, for a method a plan gives relative to the length it extends from. Every loader
 * computes the scaled frequencies once, from the pre-trained base frequencies and the pre-trained length
 * (original_max_position_embeddings); none stacks a second block on a first. So a plan that stretches the served
 * length by s exports s × served ÷ pre-trained over the pre-trained length: ×4 on top of a shipped ×4 is ×16.
 * A factor left empty already defaults to target ÷ pre-trained in the engine, which is the same chain.
 */
export function chainedMethod(method: MethodParams, l: Lineage, from: ExtendsFrom | undefined): MethodParams {
  const start = startLength(l, from);
  if (start === l.pretrainedContext || !("factor" in method) || method.factor === undefined) return method;
  return { ...method, factor: (method.factor * start) / l.pretrainedContext };
}

/** Methods that drop a shipped scaling when a plan extends from the served length (they rebuild from the bare base). */
export const DROPS_SHIPPED: readonly string[] = ["default", "base"];

/** "yarn ×4" for a shipped method: its id and, when it has one, its factor. */
export const shippedText = (m: MethodParams) =>
  "factor" in m && m.factor !== undefined ? `${m.method} ×${Number(m.factor.toPrecision(6))}` : m.method;

/** The lineage a revision's frozen model snapshot carries (present only for a model that ships scaling). */
export interface SnapshotLineage {
  servedContext: number;
  shipped: MethodParams | null;
}

type LineageSource = { trainedContext: number; lineage?: SnapshotLineage };

export const lineageOf = (m: LineageSource): Lineage | null =>
  m.lineage ? { pretrainedContext: m.trainedContext, servedContext: m.lineage.servedContext } : null;

/** The method the engine and every export run for a method of a revision (its plan's or a stage's). */
export function engineMethod(c: { model: LineageSource; extendsFrom?: ExtendsFrom }, method: MethodParams) {
  const l = lineageOf(c.model);
  return l ? chainedMethod(method, l, c.extendsFrom) : method;
}

/** A stored profile's served length: as stored, else its advertised length, else its trained length. */
export const servedContextOf = (p: {
  servedContext?: number | null;
  maxPositionEmbeddings?: number | null;
  trainedContext: number;
}) => p.servedContext ?? p.maxPositionEmbeddings ?? p.trainedContext;
