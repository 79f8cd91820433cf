import { performance } from "node:perf_hooks";
import { analyse } from "../server/engine";
import { inverseFrequencies } from "../server/engine/frequencies";
import { DEFAULT_BASE_GRID, supportedLength, supportedLengthNaive } from "../server/engine/base-bound";
import { smallestSupportingBase } from "../server/engine/base-search";
import { METHOD_IDS, type MethodParams, type ResolvedAnalysisRequest } from "../shared/schemas/analysis";

// Figures for the rotary engine: a full analysis (every method, decay curves) at a 1 048 576 target, and the
// base lower-bound search against the plain scan (every candidate from m = 0 with Math.cos), with identical answers.
// Goals on a 2-core machine: analysis < 10 ms; smallest base at 1 048 576 for d = 128 < 1 s and ≥ 10× the plain scan.

const TARGET = 1_048_576;

function everyMethod(d: number): MethodParams[] {
  const ramp = Array.from({ length: d / 2 }, (_, i) => 1 + (31 * i) / (d / 2 - 1));
  return METHOD_IDS.map((method): MethodParams => {
    if (method === "longrope") return { method, longFactor: ramp, shortFactor: ramp.map(() => 1) };
    if (method === "base") return { method, base: 50_000_000 };
    return { method } as MethodParams;
  });
}

function timeAnalysis(label: string, request: ResolvedAnalysisRequest) {
  for (let k = 0; k < 30; k++) analyse(request); // warm-up
  const samples: number[] = [];
  const start = performance.now();
  while (samples.length < 30 || performance.now() - start < 1000) {
    const t = performance.now();
    analyse(request);
    samples.push(performance.now() - t);
  }
  samples.sort((a, b) => a - b);
  const q = (p: number) => samples[Math.min(samples.length - 1, Math.floor(p * samples.length))].toFixed(2);
  console.log(`  ${label.padEnd(58)} median ${q(0.5)} ms  p95 ${q(0.95)} ms  (${samples.length} runs)`);
}

function timed<T>(fn: () => T): { value: T; ms: number } {
  const t = performance.now();
  const value = fn();
  return { value, ms: performance.now() - t };
}

function supportedLengthFigures() {
  console.log(
    "  supported length of one base, d = 128 (Men et al. 2024), fast (median of 9) vs plain scan up to 2^24:",
  );
  for (const base of [10_000, 500_000, 1_000_000, 1e8]) {
    const theta = inverseFrequencies(128, base);
    const runs = Array.from({ length: 9 }, () => timed(() => supportedLength(theta, 2 ** 24))).sort(
      (a, b) => a.ms - b.ms,
    );
    const fast = runs[4]; // median of 9
    const plain = timed(() => supportedLengthNaive(theta, 2 ** 24));
    const same = fast.value === plain.value ? "identical" : "DIFFERENT";
    console.log(
      `    b = ${base.toExponential(1).padEnd(7)} → ${String(fast.value).padStart(7)}  fast ${fast.ms.toFixed(2).padStart(8)} ms  ` +
        `plain ${plain.ms.toFixed(1).padStart(8)} ms  ×${(plain.ms / fast.ms).toFixed(1)}  ${same}`,
    );
  }
}

function gridSearchFigures(d: number, withPlain: boolean) {
  const fast = timed(() => smallestSupportingBase(d, TARGET, DEFAULT_BASE_GRID));
  const r = fast.value;
  console.log(
    `  smallest base, d = ${d}, target ${TARGET}, grid 10^(k/100) 1e3…1e10: ${r.smallestBase?.toExponential(4) ?? "none"} ` +
      `(${r.candidatesExamined}/${r.candidatesTotal} candidates)  fast ${fast.ms.toFixed(0)} ms`,
  );
  if (!withPlain) return;
  console.log("    plain scan of the same candidates (takes a while)…");
  const plain = timed(() => smallestSupportingBase(d, TARGET, DEFAULT_BASE_GRID, { scan: supportedLengthNaive }));
  const same =
    JSON.stringify(plain.value) === JSON.stringify(r)
      ? "identical answer"
      : `DIFFERENT: ${JSON.stringify(plain.value)}`;
  console.log(`    plain ${(plain.ms / 1000).toFixed(1)} s  → fast is ×${(plain.ms / fast.ms).toFixed(0)}  ${same}`);
}

export async function runEngineBench(): Promise<void> {
  console.log(`rotary engine (${METHOD_IDS.length} methods)`);
  const everyRequest = (d: number, ropeTheta: number) => ({
    model: { headDim: d, ropeTheta, trainedContext: 8192 },
    targetContext: TARGET,
    methods: everyMethod(d),
  });
  timeAnalysis(`analysis, d = 128, b = 5e5, L = 8192 → ${TARGET}`, everyRequest(128, 500_000));
  timeAnalysis(`analysis, d = 256, b = 1e4, L = 8192 → ${TARGET}`, everyRequest(256, 10_000));
  timeAnalysis(`analysis, d = 256, b = 1e6, L = 8192 → ${TARGET}`, everyRequest(256, 1_000_000));
  supportedLengthFigures();
  gridSearchFigures(128, true);
  gridSearchFigures(256, false);
}

// Run directly: node --import tsx bench/engine.bench.ts
if (import.meta.url === `file://${process.argv[1]}`) await runEngineBench();
