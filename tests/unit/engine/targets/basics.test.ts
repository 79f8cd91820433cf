import { describe, expect, it } from "vitest";
import {
  applyMergePatch,
  conformance,
  parseJsonTyped,
  writeJsonText,
  TARGETS,
  TARGET_IDS,
} from "../../../../server/engine/targets";
import { CONFIG_FLOAT_KEYS, ENGINE_FLOAT_KEYS } from "../../../../server/engine/targets/float-keys";
import { compactJson } from "../../../../server/engine/targets/engines/launch-text";
import { fingerprintBytes, rotaryFingerprint } from "../../../../server/engine/fingerprint";
import { inverseFrequencies } from "../../../../server/engine/frequencies";

describe("RFC 7396 merge patch", () => {
  // RFC 7396 Appendix A ("Example Test Cases"), each ORIGINAL / PATCH / RESULT row as the RFC lists it.
  const rows: [unknown, unknown, unknown][] = [
    [{ a: "b" }, { a: "c" }, { a: "c" }],
    [{ a: "b" }, { b: "c" }, { a: "b", b: "c" }],
    [{ a: "b" }, { a: null }, {}],
    [{ a: "b", b: "c" }, { a: null }, { b: "c" }],
    [{ a: ["b"] }, { a: "c" }, { a: "c" }],
    [{ a: "c" }, { a: ["b"] }, { a: ["b"] }],
    [{ a: { b: "c" } }, { a: { b: "d", c: null } }, { a: { b: "d" } }],
    [{ a: [{ b: "c" }] }, { a: [1] }, { a: [1] }],
    [
      ["a", "b"],
      ["c", "d"],
      ["c", "d"],
    ],
    [{ a: "b" }, ["c"], ["c"]],
    [{ a: "foo" }, null, null],
    [{ a: "foo" }, "bar", "bar"],
    [{ e: null }, { a: 1 }, { e: null, a: 1 }],
    [[1, 2], { a: "b", c: null }, { a: "b" }],
    [{}, { a: { bb: { ccc: null } } }, { a: { bb: {} } }],
  ];
  it.each(rows)("%j + %j → %j", (original, patch, result) => {
    expect(applyMergePatch(original, patch)).toEqual(result);
  });
  it("leaves the target untouched", () => {
    const original = { a: { b: 1 } };
    applyMergePatch(original, { a: { b: null } });
    expect(original).toEqual({ a: { b: 1 } });
  });
});

describe("JSON text with Python's int/float distinction", () => {
  it("writes float-typed keys with a decimal point, as Python's json.dumps writes a float (8.0, not 8)", () => {
    const text = writeJsonText({ a: { factor: 8, n: 4096, big: 1e21, list: [1, 2.5] } }, (p) => p[1] !== "n");
    expect(text).toBe(
      '{\n  "a": {\n    "factor": 8.0,\n    "n": 4096,\n    "big": 1e+21,\n    "list": [\n      1.0,\n      2.5\n    ]\n  }\n}\n',
    );
    // Same layout as JSON.stringify(…, null, 2) when nothing is float-typed.
    const v = { x: [1, { y: "z", e: [] }], o: {} };
    expect(writeJsonText(v, () => false)).toBe(JSON.stringify(v, null, 2) + "\n");
  });
  it("writes the one-line form as JSON.stringify does, float-typed keys keeping their point", () => {
    const v = { x: [1, { y: "z", e: [] }], o: {}, u: undefined };
    expect(writeJsonText(v, () => false, { compact: true })).toBe(JSON.stringify(v));
    expect(compactJson({ rope_scaling: { factor: 4, attn_factor: 1, original_max_position_embeddings: 4096 } })).toBe(
      '{"rope_scaling":{"factor":4.0,"attn_factor":1.0,"original_max_position_embeddings":4096}}',
    );
  });
  it("types the engines' keys as the library's plus SGLang's attn_factor, and nothing else", () => {
    // sgl-project/sglang rotary_embedding/factory.py (eb047c1) reads attn_factor; transformers has no such key.
    expect([...ENGINE_FLOAT_KEYS].filter((k) => !CONFIG_FLOAT_KEYS.has(k))).toEqual(["attn_factor"]);
    expect([...CONFIG_FLOAT_KEYS].every((k) => ENGINE_FLOAT_KEYS.has(k))).toBe(true);
  });
  it("reads back which numbers were written as ints (JSON Pointer paths)", () => {
    const { value, intPaths } = parseJsonTyped('{"f": 8, "g": 8.0, "h": 1e3, "l": [1, 2.0], "a/b": -0, "s": "7"}');
    expect(value).toEqual({ f: 8, g: 8, h: 1000, l: [1, 2], "a/b": -0, s: "7" });
    expect([...intPaths].sort()).toEqual(["/a~1b", "/f", "/l/0"]);
  });
  it("refuses what JSON refuses", () => {
    for (const bad of ["{", "[1,]", "01", '{"a" 1}', "1 2", "NaN", '"\u0001"']) {
      expect(() => parseJsonTyped(bad), bad).toThrow(SyntaxError);
    }
  });
});

describe("rotary fingerprint (docs/fingerprint.md)", () => {
  it("hashes the documented bytes: checked against Python's struct.pack('<Id…') and hashlib.sha256", () => {
    // python3: hashlib.sha256(b'ropewalk-rotary/1\x00' + struct.pack('<Id', 4, 1.0) + struct.pack('<2d', 1.0, 0.01))
    const one = { rotaryDim: 4, attentionFactor: 1, invFreq: [1, 0.01] };
    expect(rotaryFingerprint([one])).toBe("798b309e356082bdf96d73e42af38232ef419ea22b396bb74af72918a209be03");
    // … + struct.pack('<Id', 2, 1.5) + struct.pack('<d', 0.5): a second layer group appends one record
    const two = { rotaryDim: 2, attentionFactor: 1.5, invFreq: [0.5] };
    expect(rotaryFingerprint([one, two])).toBe("8805215bdf1b74f6c53267bc55e1cf016821982bd6682d705946f28f9cc36b8c");
    expect(fingerprintBytes([one]).length).toBe(18 + 4 + 8 + 16);
  });
  it("changes with any θ′ bit and refuses a group whose frequency count is not rotaryDim/2", () => {
    const invFreq = Array.from(inverseFrequencies(128, 10000));
    const a = rotaryFingerprint([{ rotaryDim: 128, attentionFactor: 1, invFreq }]);
    invFreq[63] = invFreq[63] * (1 + Number.EPSILON);
    expect(rotaryFingerprint([{ rotaryDim: 128, attentionFactor: 1, invFreq }])).not.toBe(a);
    expect(() => rotaryFingerprint([{ rotaryDim: 128, attentionFactor: 1, invFreq: [1] }])).toThrow(RangeError);
    expect(() => rotaryFingerprint([])).toThrow(RangeError);
  });
});

describe("conformance", () => {
  const invFreq = Array.from(inverseFrequencies(8, 10000));
  const plan = { rotaryDim: 8, base: 10000, trainedContext: 4096, targetContext: 8192, invFreq, attentionFactor: 1 };
  const reading = (f: number[], a = 1) => ({
    rotaryDim: 8,
    base: 10000,
    originalLength: 4096,
    method: "default",
    invFreq: f,
    attentionFactor: a,
    warnings: [],
  });
  it("earns exact / equivalent / differs from the read-back numbers only", () => {
    expect(conformance(plan, reading(invFreq)).status).toBe("exact");
    const f32 = invFreq.map((x) => Math.fround(x)); // float32 storage: relative error ≤ 2^-24 ≈ 6e-8
    const eq = conformance(plan, reading(f32));
    expect(eq.status).toBe("equivalent");
    expect(eq.maxRelativeError).toBeLessThanOrEqual(2 ** -24);
    const off = invFreq.slice();
    off[3] *= 1.001;
    const d = conformance(plan, reading(off));
    expect(d).toMatchObject({ status: "differs", worstPair: 3 });
    expect(d.maxRelativeError).toBeCloseTo(0.001, 9);
    const a = conformance(plan, reading(invFreq, 1.1));
    expect(a).toMatchObject({ status: "differs", worstPair: null });
    expect(a.cause).toMatch(/attention factor/);
  });
  it("a target that cannot express the plan is unsupported, with its cause and workaround", () => {
    const c = conformance(plan, null, { ok: false, cause: "no way", workaround: "try x" });
    expect(c).toEqual({
      status: "unsupported",
      maxRelativeError: null,
      worstPair: null,
      cause: "no way",
      workaround: "try x",
    });
  });
  it("every target id has an entry", () => {
    expect(Object.keys(TARGETS).sort()).toEqual([...TARGET_IDS].sort());
    for (const id of TARGET_IDS) expect(TARGETS[id].id).toBe(id);
  });
});
