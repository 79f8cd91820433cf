import { describe, expect, it } from "vitest";
import { createEventParser, type ServerEvent } from "../../../client/src/features/workbench/api/server-events";
import { inputsToParams, parseInputs } from "../../../client/src/features/workbench/state/url-codec";
import { toRequest } from "../../../client/src/features/workbench/state/to-request";
import type { WorkbenchInputs } from "../../../client/src/features/workbench/state/inputs";
import { defaultInputs } from "../../../client/src/features/workbench/state/inputs";
import { shippedRow } from "../../../client/src/features/workbench/state/shipped-row";
import { methodLabels } from "../../../client/src/features/workbench/state/method-labels";

// Moved out of tests/e2e/workbench.e2e.test.ts: pure client logic needs no browser.
// Pure pieces of the workbench, checked without a browser.
describe("workbench state", () => {
  it("URL params round-trip the inputs, half-typed values included", () => {
    const inputs: WorkbenchInputs = {
      model: { kind: "shape", headDim: "128", ropeTheta: "10000", trainedContext: "40", partialRotaryFactor: "" },
      target: "32768",
      alpha: "",
      beta: "16",
      methods: [
        { method: "yarn", params: { betaFast: "24", truncate: "false" } },
        { method: "longrope", params: { longFactor: "1, 2, 3" } },
      ],
      view: 1,
      flaggedOnly: true,
    };
    expect(parseInputs(new URLSearchParams(inputsToParams(inputs).toString()))).toEqual(inputs);
    // A mangled methods param falls back to the defaults instead of breaking the page.
    expect(parseInputs(new URLSearchParams("methods=%5B%5B%22bogus%22%5D%5D")).methods.map((m) => m.method)).toEqual([
      "linear",
      "yarn",
    ]);
  });

  it("turns typed inputs into the shared analysis contract, naming each bad field like the API does", () => {
    const base: WorkbenchInputs = {
      model: { kind: "shape", headDim: "128", ropeTheta: "10000", trainedContext: "4096", partialRotaryFactor: "" },
      target: "32768",
      alpha: "",
      beta: "",
      methods: [{ method: "yarn", params: { factor: "8" } }],
      view: 0,
      flaggedOnly: false,
    };
    expect(toRequest(base, null).request).toEqual({
      model: { headDim: 128, ropeTheta: 10000, trainedContext: 4096 },
      targetContext: 32768,
      methods: [{ method: "yarn", factor: 8 }],
    });
    const bad = toRequest({ ...base, target: "2048", methods: [{ method: "yarn", params: { factor: "x" } }] }, null);
    expect(bad.request).toBeNull();
    expect(bad.errors["methods.0.factor"]).toBe("Factor of method 1 must be a number.");
    const short = toRequest({ ...base, target: "2048" }, null);
    expect(Object.keys(short.errors)).toEqual(["targetContext"]);
  });

  it("reads server-sent events split anywhere across chunks", () => {
    const seen: ServerEvent[] = [];
    const parser = createEventParser((e) => seen.push(e));
    const text =
      'event: progress\ndata: {"candidatesExamined":1,"total":9}\n\n: comment\nevent: result\r\ndata: {"a":\ndata: 1}\n\n';
    for (let i = 0; i < text.length; i += 7) parser.push(text.slice(i, i + 7));
    parser.end();
    expect(seen).toEqual([
      { event: "progress", data: '{"candidatesExamined":1,"total":9}' },
      { event: "result", data: '{"a":\n1}' },
    ]);
  });
});

describe("the as-shipped row", () => {
  it("carries the shipped method with its factor and survives the URL round trip", () => {
    const row = shippedRow({ method: "yarn", factor: 4, betaFast: 32, betaSlow: 1 });
    expect(row).toEqual({ method: "yarn", params: { factor: "4", betaFast: "32", betaSlow: "1" }, shipped: true });
    const inputs = { ...defaultInputs(), methods: [row, { method: "linear" as const, params: {} }] };
    expect(parseInputs(inputsToParams(inputs)).methods).toEqual(inputs.methods);
  });
});

describe("the legends' names for the analysed methods", () => {
  it("name the as-shipped row as its picker does, and an edited copy by its method", () => {
    // key order as the profile's block might hold it, unlike the row's
    const shipped = { method: "yarn" as const, betaSlow: 1, betaFast: 32, factor: 4 };
    const row = shippedRow(shipped);
    const edited = { method: "yarn" as const, params: { ...row.params, factor: "8" } };
    const inputs: WorkbenchInputs = {
      ...defaultInputs(),
      model: { kind: "shape", headDim: "128", ropeTheta: "500000", trainedContext: "8192", partialRotaryFactor: "" },
      target: "32768",
      methods: [row, edited, { method: "linear", params: {} }],
    };
    const { request } = toRequest(inputs, null);
    expect(request).not.toBeNull();
    expect(methodLabels(request!.methods, shipped)).toEqual([
      "As shipped (yarn ×4)",
      "YaRN (ramped per pair, with attention factor)",
      "Position interpolation (every pair divided)",
    ]);
    // a model that ships nothing: every row by its method
    expect(methodLabels(request!.methods, null)[0]).toBe("YaRN (ramped per pair, with attention factor)");
  });
});
