import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { analyse, ENGINE_VERSION } from "../../../server/engine";
import { methodParamsSchema, type ResolvedAnalysisRequest } from "../../../shared/schemas/analysis";
import {
  formatPairCsvHeader,
  pairCsvHeader,
  readPairCsvHeader,
} from "../../../client/src/features/workbench/state/csv-header";

const request: ResolvedAnalysisRequest = {
  model: { headDim: 128, ropeTheta: 10_000, trainedContext: 4096 },
  targetContext: 32_768,
  methods: [{ method: "linear" }, { method: "yarn", betaFast: 24 }],
};

/** A pair CSV as the workbench writes it: the header, then the table (here two columns of the second method: pair index and scaled wavelength). */
function download(profile: string | null) {
  const analysis = analyse(request);
  const header = pairCsvHeader(analysis, 1, profile, true);
  const table = Papa.unparse({
    fields: ["Pair i", "λ′ (tokens)"],
    data: analysis.methods[1].pairs.map((p) => [p.index, p.scaledWavelength]),
  });
  return { analysis, header, text: formatPairCsvHeader(header) + table };
}

describe("the workbench's pair CSV says what produced it", () => {
  it("names the model, method, parameters and engine version in # lines that parse back exactly", () => {
    const { analysis, header, text } = download("Heron 7B (demo)");
    expect(
      text
        .split("\n")
        .slice(0, 9)
        .every((line) => line.startsWith("# ")),
    ).toBe(true);
    expect(readPairCsvHeader(text)).toEqual(header);
    expect(header).toMatchObject({
      model: { rotaryDim: 128, headDim: 128, ropeTheta: 10_000, trainedContext: 4096, partialRotaryFactor: 1 },
      profile: "Heron 7B (demo)",
      method: "yarn",
      "target length": 32_768,
      "engine version": ENGINE_VERSION,
      rows: "flagged pairs only",
    });
    // The parameters are the engine's, defaults filled in (factor s = L′/L = 8), and a valid request member.
    expect(methodParamsSchema.parse(header.parameters)).toEqual(analysis.methods[1].params);
    expect(header.parameters).toMatchObject({ method: "yarn", factor: 8, betaFast: 24 });
  });

  it("the header alone reproduces the figures: the same model and parameters give the same rows", () => {
    const { analysis, text } = download(null);
    const read = readPairCsvHeader(text);
    const { rotaryDim: _d, ...shape } = read.model!;
    const again = analyse({
      model: shape,
      targetContext: read["target length"]!,
      bands: read.bands,
      methods: [methodParamsSchema.parse(read.parameters)],
    });
    expect(again.methods[0].pairs).toEqual(analysis.methods[1].pairs);
    expect(read.profile).toBeNull();
  });

  it("CSV readers skip the header when told # starts a comment, and read the table unchanged", () => {
    const { analysis, text } = download("name with\na line break");
    const parsed = Papa.parse<string[]>(text.trim(), { comments: "#" });
    expect(parsed.data[0]).toEqual(["Pair i", "λ′ (tokens)"]);
    expect(parsed.data.length - 1).toBe(analysis.methods[1].pairs.length);
    expect(Number(parsed.data[1][1])).toBe(analysis.methods[1].pairs[0].scaledWavelength);
    // A line break in a profile name cannot end the comment early.
    expect(readPairCsvHeader(text).profile).toBe("name with a line break");
  });
});
