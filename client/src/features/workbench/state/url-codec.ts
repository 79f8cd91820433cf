import { z } from "zod";
import { METHOD_IDS, MAX_METHODS } from "@shared/schemas/analysis";
import { defaultInputs, DEFAULT_METHODS, type MethodRow, type ModelChoice, type WorkbenchInputs } from "./inputs";

/**
 * The workbench's inputs as URL search params, so a link reproduces the view:
 *   model=7 group=sliding_attention   a saved profile (and the layer group analysed, absent = the scaled one), or
 *   shape=128,10000,4096,1       headDim, ropeTheta, trainedContext, partialRotaryFactor typed in
 *   target=32768 alpha=1 beta=32 (empty = default)
 *   methods=[["linear",{}],["yarn",{"betaFast":"32"}]]   one JSON param: [method, params as typed, "shipped"?]
 *   view=1 flagged=1
 */
const methodsParam = z
  .array(z.tuple([z.enum(METHOD_IDS), z.record(z.string(), z.string())], z.literal("shipped")))
  .max(MAX_METHODS);

function parseMethods(raw: string | null): MethodRow[] {
  if (raw === null) return DEFAULT_METHODS;
  try {
    const parsed = methodsParam.safeParse(JSON.parse(raw));
    return parsed.success
      ? parsed.data.map(([method, params, shipped]) => ({
          method,
          params,
          ...(shipped ? { shipped: true as const } : {}),
        }))
      : DEFAULT_METHODS;
  } catch {
    return DEFAULT_METHODS;
  }
}

function parseModel(params: URLSearchParams): ModelChoice {
  const shape = params.get("shape");
  if (shape !== null) {
    const [headDim = "", ropeTheta = "", trainedContext = "", partialRotaryFactor = ""] = shape.split(",");
    return { kind: "shape", headDim, ropeTheta, trainedContext, partialRotaryFactor };
  }
  const id = Number(params.get("model"));
  const group = params.get("group");
  return { kind: "saved", id: Number.isInteger(id) && id > 0 ? id : null, ...(group ? { group } : {}) };
}

export function parseInputs(params: URLSearchParams): WorkbenchInputs {
  const base = defaultInputs();
  const view = Number(params.get("view") ?? 0);
  return {
    model: parseModel(params),
    target: params.get("target") ?? base.target,
    alpha: params.get("alpha") ?? base.alpha,
    beta: params.get("beta") ?? base.beta,
    methods: parseMethods(params.get("methods")),
    view: Number.isInteger(view) && view >= 0 ? view : 0,
    flaggedOnly: params.get("flagged") === "1",
  };
}

/** Drops empty strings so URLs stay short; the row order is kept. */
const compactParams = (p: Record<string, string>) =>
  Object.fromEntries(Object.entries(p).filter(([, v]) => v.trim() !== ""));

export function inputsToParams(inputs: WorkbenchInputs): URLSearchParams {
  const out = new URLSearchParams();
  const m = inputs.model;
  if (m.kind === "saved") {
    if (m.id !== null) out.set("model", String(m.id));
    if (m.id !== null && m.group) out.set("group", m.group);
  } else {
    out.set(
      "shape",
      [m.headDim, m.ropeTheta, m.trainedContext, m.partialRotaryFactor].map((v) => v.replace(/,/g, "")).join(","),
    );
  }
  if (inputs.target) out.set("target", inputs.target);
  if (inputs.alpha) out.set("alpha", inputs.alpha);
  if (inputs.beta) out.set("beta", inputs.beta);
  out.set(
    "methods",
    JSON.stringify(inputs.methods.map((r) => [r.method, compactParams(r.params), ...(r.shipped ? ["shipped"] : [])])),
  );
  if (inputs.view > 0) out.set("view", String(inputs.view));
  if (inputs.flaggedOnly) out.set("flagged", "1");
  return out;
}

/** "?model=7&target=…" for links into the workbench from elsewhere (a profile page, a plan). */
export function workbenchSearch(opts: { modelId: number; trainedContext?: number; methods?: MethodRow[] }): string {
  const inputs: WorkbenchInputs = {
    ...defaultInputs(),
    model: { kind: "saved", id: opts.modelId },
    target: opts.trainedContext ? String(opts.trainedContext * 4) : "",
    methods: opts.methods ?? DEFAULT_METHODS,
  };
  return `?${inputsToParams(inputs).toString()}`;
}
