import { EVIDENCE_KINDS, type EvidenceKind } from "@shared/schemas/evidence";

/** Kinds that take an uploaded file; parity is decided by the probe checks recorded on the revision. */
export const FILE_KINDS = EVIDENCE_KINDS.filter((k): k is Exclude<EvidenceKind, "parity"> => k !== "parity");
export type FileKind = (typeof FILE_KINDS)[number];
export const isFileKind = (k: EvidenceKind | null | undefined): k is FileKind => !!k && k !== "parity";
