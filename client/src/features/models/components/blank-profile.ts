import type { ModelProfile, ModelProfileInput } from "@shared/schemas/models";

/** A new profile starts empty except for the values almost every model shares. */
export const BLANK_PROFILE: Partial<ModelProfileInput> = {
  name: "",
  family: "",
  partialRotaryFactor: 1,
  ropeTheta: 10_000,
  maxPositionEmbeddings: null,
  servedContext: null,
  parametersTotal: null,
  bytesPerElement: 2,
  provenance: "",
  currentScaling: null,
};

/** The editable part of a stored profile. */
export function profileInput(m: ModelProfile): ModelProfileInput {
  const {
    id: _id,
    rotaryDim: _d,
    pairs: _p,
    sourceFileName: _f,
    importWarnings: _w,
    createdBy: _c,
    createdAt: _ca,
    updatedAt: _u,
    retiredAt: _r,
    ...input
  } = m;
  return input;
}

/** An import preview (every field optional) laid over the blank profile. */
export const previewInput = (profile: Partial<ModelProfileInput>): Partial<ModelProfileInput> => ({
  ...BLANK_PROFILE,
  ...profile,
});
