import type { Db } from "../../db/client";
import { modelProfiles } from "../../db/schema";

/** Three invented families of the demo lab, with different shapes (not real models). */
export const DEMO_PROFILES = [
  {
    name: "Heron-1.3B",
    family: "heron",
    headDim: 64,
    partialRotaryFactor: 0.5,
    ropeTheta: 10_000,
    trainedContext: 2048,
    maxPositionEmbeddings: 2048,
    layers: 24,
    attentionHeads: 32,
    kvHeads: 32,
    hiddenSize: 2048,
    parameters: 1.21e9,
    parametersTotal: 1.31e9,
    bytesPerElement: 2,
    provenance: "Saltmarsh lab notes: small partial-rotation model, half of each head rotates.",
  },
  {
    name: "Gannet-8B",
    family: "gannet",
    headDim: 128,
    partialRotaryFactor: 1,
    ropeTheta: 500_000,
    trainedContext: 8192,
    maxPositionEmbeddings: 8192,
    layers: 32,
    attentionHeads: 32,
    kvHeads: 8,
    hiddenSize: 4096,
    parameters: 6.98e9,
    parametersTotal: 8.03e9,
    bytesPerElement: 2,
    provenance: "Saltmarsh lab notes: grouped KV heads (4 query heads per KV head).",
  },
  {
    name: "Albatross-27B",
    family: "albatross",
    headDim: 256,
    partialRotaryFactor: 1,
    ropeTheta: 1_000_000,
    trainedContext: 16384,
    maxPositionEmbeddings: 16384,
    layers: 46,
    attentionHeads: 32,
    kvHeads: 16,
    hiddenSize: 4608,
    parameters: 2.51e10,
    parametersTotal: 2.72e10,
    bytesPerElement: 2,
    provenance: "Saltmarsh lab notes: wide heads (256) with a large base.",
  },
];

export async function seedModelProfiles(db: Db, people: Map<string, number>) {
  const createdBy = people.get("researcher@ropewalk.test") ?? null;
  for (const p of DEMO_PROFILES) {
    await db
      .insert(modelProfiles)
      .values({ ...p, createdBy })
      .onConflictDoNothing({ target: modelProfiles.name });
  }
}
