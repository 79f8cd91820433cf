import type { MethodId } from "@shared/schemas/analysis";

/**
 * What the workbench's inputs hold: the text exactly as typed (so a half-typed number survives a reload),
 * turned into a request only when it is valid.
 */
export type ModelChoice =
  /** `group`: the layer group analysed (its kind); absent = the group scaling applies to. */
  | { kind: "saved"; id: number | null; group?: string }
  | { kind: "shape"; headDim: string; ropeTheta: string; trainedContext: string; partialRotaryFactor: string };

/** `shipped`: the row is the saved profile's own scaling, as its config ships it ("as shipped", shared/lineage.ts). */
export type MethodRow = { method: MethodId; params: Record<string, string>; shipped?: true };

export type WorkbenchInputs = {
  model: ModelChoice;
  target: string;
  alpha: string;
  beta: string;
  methods: MethodRow[];
  /** Which method row the spectrum chart and the pair table show. */
  view: number;
  flaggedOnly: boolean;
};

export const DEFAULT_METHODS: MethodRow[] = [
  { method: "linear", params: {} },
  { method: "yarn", params: {} },
];

export const EMPTY_SHAPE: ModelChoice = {
  kind: "shape",
  headDim: "",
  ropeTheta: "",
  trainedContext: "",
  partialRotaryFactor: "",
};

export const defaultInputs = (): WorkbenchInputs => ({
  model: { kind: "saved", id: null },
  target: "",
  alpha: "",
  beta: "",
  methods: DEFAULT_METHODS,
  view: 0,
  flaggedOnly: false,
});
