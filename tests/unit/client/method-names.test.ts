import { describe, expect, it } from "vitest";
import { METHOD_CATALOG, METHOD_IDS } from "../../../shared/methods";
import { METHOD_LABELS } from "../../../client/src/features/workbench/state/method-fields";
import { METHOD_TOPICS } from "../../../client/src/features/workbench/explain/topics";
import { toRequest } from "../../../client/src/features/workbench/state/to-request";
import { defaultInputs } from "../../../client/src/features/workbench/state/inputs";
import {
  METHOD_TABLE,
  methodLabel,
  methodShort,
  describeParams,
} from "../../../client/src/features/plans/lib/method-table";

describe("workbench and plan editor read one catalog", () => {
  it("both show the catalog's name for every method, in the catalog's order", () => {
    expect(METHOD_TABLE.map((m) => m.id)).toEqual(METHOD_IDS);
    for (const id of METHOD_IDS) {
      expect(METHOD_LABELS[id]).toBe(METHOD_CATALOG[id].label);
      expect(methodLabel(id)).toBe(METHOD_CATALOG[id].label);
      expect(methodShort(id)).toBe(METHOD_CATALOG[id].short);
      expect(METHOD_TOPICS[id].title).toBe(METHOD_CATALOG[id].label);
    }
  });

  it("an id that is no method shows as itself, even one Object.prototype has", () => {
    for (const id of ["constructor", "__proto__", "rope"]) {
      expect(methodLabel(id)).toBe(id);
      expect(describeParams({ method: id, toString: 3 })).toBe("toString 3");
    }
  });

  it("the plan editor names parameters with the catalog's field labels", () => {
    expect(describeParams({ method: "yarn", betaFast: 40, truncate: false })).toBe(
      "β fast (rotations) 40, Round the ramp ends to whole pairs no",
    );
  });

  it("the workbench turns every catalog field into a request field of the same key", () => {
    for (const id of METHOD_IDS) {
      const params = Object.fromEntries(
        METHOD_CATALOG[id].fields.map((f) => [
          f.key,
          f.kind === "boolean"
            ? "false"
            : f.kind === "list"
              ? "1, 1"
              : /betaFast|highFreqFactor/.test(f.key)
                ? "8"
                : "2",
        ]),
      );
      const inputs = {
        ...defaultInputs(),
        model: {
          kind: "shape" as const,
          headDim: "4",
          ropeTheta: "10000",
          trainedContext: "4096",
          partialRotaryFactor: "",
        },
        target: "32768",
        methods: [{ method: id, params }],
      };
      // d = 4 (two pairs), so each list has two entries; the fast/high bounds exceed the slow/low ones.
      const { request, errors } = toRequest(inputs, null);
      expect(errors, id).toEqual({});
      expect(Object.keys(request!.methods[0]).sort()).toEqual(
        ["method", ...METHOD_CATALOG[id].fields.map((f) => f.key)].sort(),
      );
    }
  });
});
