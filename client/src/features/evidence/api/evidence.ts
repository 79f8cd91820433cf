import { queryOptions, useMutation, useQueryClient } from "@tanstack/react-query";
import type { FileKind } from "../lib/kinds";
import {
  evidenceListResponseSchema,
  evidenceUploadResponseSchema,
  proofResponseSchema,
  type ProofRequest,
} from "@shared/schemas/evidence-api";
import { apiClient } from "@/lib/api-client";
import { apiPaths } from "@/config/paths";

/** Query keys of the evidence feature: one revision's evidence, verdicts and proof decisions. */
export const evidenceKeys = {
  all: ["evidence"] as const,
  revision: (planId: number, n: number) => [...evidenceKeys.all, planId, n] as const,
};

export const fetchEvidence = (planId: number, n: number, signal?: AbortSignal) =>
  apiClient.get(apiPaths.revisionEvidence(planId, n), evidenceListResponseSchema, signal);

/** GET …/revisions/:n/evidence: the files, each criterion's verdict and the proof decisions. */
export const evidenceQuery = (planId: number, n: number) =>
  queryOptions({
    queryKey: evidenceKeys.revision(planId, n),
    queryFn: ({ signal }) => fetchEvidence(planId, n, signal),
  });

export type UploadArgs = {
  planId: number;
  n: number;
  file: File;
  kind: FileKind;
  fingerprint: string;
  /** sent as typed: the server parses it and names a bad field */
  provenance: string;
};

/** The multipart upload of the fixed contract: parts file, kind, fingerprint and provenance. */
export function uploadEvidence({ planId, n, file, kind, fingerprint, provenance }: UploadArgs) {
  const form = new FormData();
  form.append("kind", kind);
  form.append("fingerprint", fingerprint);
  form.append("provenance", provenance);
  form.append("file", file, file.name);
  return apiClient.send("POST", apiPaths.revisionEvidence(planId, n), form, evidenceUploadResponseSchema);
}

export function useUploadEvidence() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadEvidence,
    onSuccess: (_r, { planId, n }) => queryClient.invalidateQueries({ queryKey: evidenceKeys.revision(planId, n) }),
  });
}

type ProofArgs = { planId: number; n: number; body: ProofRequest };

/** An approver's proof decision, carrying the content hash and evidence ids they were shown. */
export const decideProof = ({ planId, n, body }: ProofArgs) =>
  apiClient.send("POST", apiPaths.revisionProof(planId, n), body, proofResponseSchema);

export function useDecideProof() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: decideProof,
    onSettled: (_r, _e, { planId, n }) => queryClient.invalidateQueries({ queryKey: evidenceKeys.revision(planId, n) }),
  });
}
