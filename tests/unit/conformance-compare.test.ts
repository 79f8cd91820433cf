import { describe, expect, it } from "vitest";
import { compareProbe, type RevisionRotary } from "../../server/features/plans/conformance-compare";
import type { ProbeResult } from "../../shared/schemas/conformance";

/*
 * Probe results against a revision's own rotary facts, group by group (issue 11). d = 4: two pairs. Local layers keep
 * plain RoPE over base 100, θ = (1, 100^(−1/2)) = (1, 0.1); full layers are linear ×4 over base 10 000,
 * θ = (1, 0.01) / 4 = (0.25, 0.0025) (Su et al. 2021 eq. 15; Chen et al. 2023 eq. 2). Values worked by hand.
 */
const LOCAL = [1, 0.1];
const FULL = [0.25, 0.0025];

const layered: RevisionRotary = {
  rotaryDim: 4,
  targetContext: 16384,
  method: "linear",
  invFreq: FULL,
  attentionFactor: 1,
  groups: [
    { kind: "sliding_attention", layers: [0, 1], rotaryDim: 4, invFreq: LOCAL, attentionFactor: 1 },
    { kind: "full_attention", layers: [2], rotaryDim: 4, invFreq: FULL, attentionFactor: 1 },
  ],
};

const group = (layerType: string, layers: number[], invFreq: number[]) => ({
  layerType,
  layers,
  ropeType: "x",
  rotaryDim: invFreq.length * 2,
  attentionFactor: 1,
  invFreq,
});

const probe = (over: Partial<ProbeResult> = {}): ProbeResult => ({
  probe: "ropewalk-probe/1",
  library: "transformers",
  libraryVersion: "5.0.0",
  ropeType: "linear",
  runningLength: 16384,
  rotaryDim: 4,
  attentionFactor: 1,
  invFreq: FULL,
  planFingerprint: null,
  readFingerprint: "0".repeat(64),
  layerType: null,
  ...over,
});

const both = (local = LOCAL, full = FULL) => [
  group("sliding_attention", [0, 1], local),
  group("full_attention", [2], full),
];

describe("a layered revision against a probe result", () => {
  it("every group read as planned: passes with error 0", () => {
    const held = { passed: true, maxRelativeError: 0, worstPair: null, cause: "" };
    expect(compareProbe(layered, probe({ layerGroups: both() }))).toEqual({
      ...held,
      groups: [
        { kind: "sliding_attention", layers: [0, 1], ...held },
        { kind: "full_attention", layers: [2], ...held },
      ],
    });
  });

  it("the worst group is reported by name: local pair 1 read at 0.11 is 10% off", () => {
    const r = compareProbe(layered, probe({ layerGroups: both([1, 0.11]) }));
    expect(r).toMatchObject({ passed: false, worstPair: 1 });
    expect(r.maxRelativeError).toBeCloseTo(0.1, 12);
    expect(r.cause).toBe("the sliding_attention layers: pair 1 turns at 0.11 rad/token, the revision's at 0.1");
    // each group in its own words: the local layers slip, the full layers hold
    expect(r.groups).toMatchObject([
      {
        kind: "sliding_attention",
        passed: false,
        worstPair: 1,
        cause: "pair 1 turns at 0.11 rad/token, the revision's at 0.1",
      },
      { kind: "full_attention", passed: true, maxRelativeError: 0, worstPair: null, cause: "" },
    ]);
    expect(r.groups![0].maxRelativeError).toBeCloseTo(0.1, 12);
  });

  it("layer types over other layers, a missing type and an extra type pair nothing", () => {
    const moved = [group("sliding_attention", [0], LOCAL), group("full_attention", [1, 2], FULL)];
    const unread = { passed: false, maxRelativeError: null, worstPair: null };
    expect(compareProbe(layered, probe({ layerGroups: moved }))).toEqual({
      ...unread,
      cause: "the library's sliding_attention layers are 0; the revision's are 0–1",
      groups: [
        {
          kind: "sliding_attention",
          layers: [0, 1],
          ...unread,
          cause: "the library's sliding_attention layers are 0; the revision's are 0–1",
        },
        {
          kind: "full_attention",
          layers: [2],
          ...unread,
          cause: "the library's full_attention layers are 1–2; the revision's are 2",
        },
      ],
    });
    expect(compareProbe(layered, probe({ layerGroups: [group("full_attention", [2], FULL)] })).cause).toBe(
      "the probe read no sliding_attention layers (the revision's layers 0–1)",
    );
    const extra = [...both(), group("chunked_attention", [3], FULL)];
    expect(compareProbe(layered, probe({ layerGroups: extra })).cause).toBe(
      "the library rotates chunked_attention layers, which the revision does not",
    );
  });

  it("one flat reading gives every layer the full layers' setting: the local layers are off", () => {
    // pair 0: |0.25 − 1| / 1 = 0.75; pair 1: |0.0025 − 0.1| / 0.1 = 0.975, the worst
    const r = compareProbe(layered, probe());
    expect(r).toMatchObject({ passed: false, worstPair: 1 });
    expect(r.maxRelativeError).toBeCloseTo(0.975, 12);
    expect(r.cause).toBe("the sliding_attention layers: pair 1 turns at 0.0025 rad/token, the revision's at 0.1");
    expect(r.groups!.map((g) => [g.kind, g.passed])).toEqual([
      ["sliding_attention", false],
      ["full_attention", true],
    ]);
  });

  it("a flat reading of a one-group revision lists no groups", () => {
    const single = { ...layered, groups: undefined };
    expect(compareProbe(single, probe()).groups).toBeNull();
  });

  it("a dynamic revision notes the running length only when pairs were compared", () => {
    const dynamic = { ...layered, method: "dynamic" as const };
    const moved = [group("sliding_attention", [0], LOCAL), group("full_attention", [1, 2], FULL)];
    expect(compareProbe(dynamic, probe({ layerGroups: moved, runningLength: 8192 })).cause).not.toMatch(/8192/);
    expect(compareProbe(dynamic, probe({ layerGroups: both(), runningLength: 8192 })).cause).toBe(
      "the probe ran at 8192 tokens, the revision's frequencies are for 16384",
    );
  });
});

describe("a one-group revision against a layered probe result", () => {
  const single: RevisionRotary = {
    rotaryDim: 4,
    targetContext: 16384,
    method: "linear",
    invFreq: FULL,
    attentionFactor: 1,
  };

  it("every layer type must rotate as the revision's one setting", () => {
    expect(compareProbe(single, probe({ layerGroups: both(FULL, FULL) })).passed).toBe(true);
    const r = compareProbe(single, probe({ layerGroups: both() }));
    expect(r.passed).toBe(false);
    expect(r.cause).toMatch(/^the sliding_attention layers: pair [01] turns at/);
  });
});
