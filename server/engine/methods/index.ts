import type { MethodParams } from "../../../shared/schemas/analysis";
import type { MethodContext, MethodOutput, MethodTable } from "../types";
import { defaultMethod } from "./default";
import { linearMethod } from "./linear";
import { ntkMethod } from "./ntk";
import { dynamicMethod } from "./dynamic";
import { yarnMethod } from "./yarn";
import { llama3Method } from "./llama3";
import { longropeMethod } from "./longrope";
import { baseMethod } from "./base";

/**
 * The formulas, keyed by method id. The mapped type makes a catalog entry (shared/methods/catalog.ts) without
 * its function here, or a function taking another method's parameters, a type error.
 */
export const METHODS = {
  default: defaultMethod,
  linear: linearMethod,
  ntk: ntkMethod,
  dynamic: dynamicMethod,
  yarn: yarnMethod,
  llama3: llama3Method,
  longrope: longropeMethod,
  base: baseMethod,
} satisfies MethodTable;

/** Dispatch on the discriminant; the table type guarantees METHODS[p.method] accepts exactly that member. */
export function runMethod(ctx: MethodContext, params: MethodParams): MethodOutput {
  const fn = METHODS[params.method] as (c: MethodContext, p: MethodParams) => MethodOutput;
  return fn(ctx, params);
}
