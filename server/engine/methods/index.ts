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

/** The table of rotary methods, keyed by id; adding a method = one file here + one union member in the schema. */
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
