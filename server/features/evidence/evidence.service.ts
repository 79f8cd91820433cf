import crypto from "node:crypto";
import { z } from "zod";
import type { AppDeps } from "../../deps";
import type { Executor } from "../../db/client";
import { recordAudit } from "../../platform/audit";
import { AppError, Forbidden, Invalid, NotFound } from "../../platform/errors";
import { hasRole } from "../../platform/roles";
import { parseOr400 } from "../../platform/validate";
import type { SessionUser } from "../../../shared/schemas";
import { evidenceKindSchema } from "../../../shared/schemas/evidence";
import {
  fingerprintSchema,
  provenanceSchema,
  type Evidence,
  type EvidenceList,
  type Provenance,
} from "../../../shared/schemas/evidence-api";
import {
  checksOfPlan,
  fingerprintOfRow,
  mustPlan,
  mustRevision,
  checkedProofs,
  signingKey,
  type PlanRow,
  type RevisionContent,
  type RevisionRow,
} from "../plans";
import type { FileKind } from "../../engine/evidence/rows";
import { parseEvidence } from "./parse";
import * as repo from "./evidence.repo";
import { verdicts } from "./verdicts";

export interface UploadForm {
  file: { originalname: string; buffer: Buffer } | undefined;
  fields: Record<string, unknown>;
}

/** The text parts, each refused with a 400 naming it before anything is read from the file. */
function readForm(form: UploadForm): { kind: FileKind; fingerprint: string; provenance: Provenance; file: Buffer } {
  const { kind, fingerprint } = parseOr400(
    z.object({ kind: evidenceKindSchema, fingerprint: fingerprintSchema }),
    { kind: form.fields.kind, fingerprint: form.fields.fingerprint },
    "form",
  );
  if (kind === "parity")
    throw new Invalid("parity is decided by the probe checks recorded on the revision, not by an upload", {
      kind: "parity takes no file: post the probe result to …/conformance-checks",
    });
  let raw: unknown;
  try {
    raw = JSON.parse(String(form.fields.provenance ?? ""));
  } catch {
    throw new Invalid("provenance must be JSON", { provenance: "not valid JSON" });
  }
  const { provenance } = parseOr400(z.object({ provenance: provenanceSchema }), { provenance: raw }, "form");
  if (!form.file) throw new Invalid("attach the results file as the multipart part 'file'", { file: "missing" });
  return { kind, fingerprint, provenance, file: form.file.buffer };
}

/** Researchers on the plan: its owner, or the author of the revision the evidence is for. */
function mayUpload(user: SessionUser, plan: PlanRow, rev: RevisionRow) {
  return hasRole(user, "researcher") && (plan.ownerId === user.id || rev.authorId === user.id);
}

const toEvidence = (n: number, e: repo.EvidenceHead): Evidence => ({
  id: e.id,
  revision: n,
  kind: e.kind as Evidence["kind"],
  fileName: e.fileName,
  format: e.format,
  checksum: e.checksum,
  bytes: e.sizeBytes,
  rows: e.rows as Evidence["rows"],
  fingerprint: e.fingerprint,
  provenance: e.provenance as Provenance,
  by: { id: e.byUserId, name: e.byName },
  via: e.via,
  at: e.createdAt.toISOString(),
});

/**
 * Stores an evaluation file against an approved revision: form and file are parsed first (a 400 stores nothing), then,
 * with the revision row locked, state and fingerprint are checked and the row and its audit event written together.
 */
export async function uploadEvidence(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number,
  form: UploadForm,
  via: "session" | "token",
): Promise<{ evidence: Evidence }> {
  const { kind, fingerprint, provenance, file } = readForm(form);
  const parsed = parseEvidence(kind, file);
  const format = file
    .toString("utf8")
    .replace(/^\uFEFF/, "")
    .trimStart()
    .startsWith("{")
    ? "harness"
    : "csv";
  return deps.db.transaction(async (tx) => {
    const plan = await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    if (!mayUpload(actor, plan, rev)) throw new Forbidden("only researchers on the plan upload evidence");
    if (rev.state !== "approved")
      throw new AppError(
        "conflict",
        "not_approved",
        `revision ${n} is ${rev.state}; evidence attaches to an approved revision`,
        {
          state: rev.state,
        },
      );
    const expected = fingerprintOfRow(rev);
    if (fingerprint !== expected)
      throw new AppError(
        "conflict",
        "fingerprint_mismatch",
        `the model that was run has rotary fingerprint ${fingerprint.slice(0, 12)}…, revision ${n} plans ${expected.slice(0, 12)}…`,
        { fingerprint: `revision ${n} has ${expected}` },
      );
    const checksum = crypto.createHash("sha256").update(file).digest("hex");
    const row = await repo.insertEvidence(tx, {
      planId,
      revisionId: rev.id,
      kind,
      fileName: (form.file!.originalname || `${kind}.${format === "csv" ? "csv" : "json"}`).slice(0, 200),
      format,
      content: file,
      checksum,
      sizeBytes: file.length,
      rows: parsed.rows,
      fingerprint,
      provenance,
      byUserId: actor.id,
      via,
    });
    await recordAudit(tx, {
      actorId: actor.id,
      action: "evidence.uploaded",
      subjectType: "plan",
      subjectId: planId,
      detail: { revision: n, evidence: row.id, kind, checksum, rows: parsed.rows.length, via },
    });
    return { evidence: toEvidence(n, { ...row, byName: actor.name }) };
  });
}

/** Evidence, verdicts and proof decisions of one revision, read in one snapshot. */
export async function revisionEvidence(ex: Executor, deps: AppDeps, planId: number, n: number): Promise<EvidenceList> {
  await mustPlan(ex, planId);
  const rev = await mustRevision(ex, planId, n);
  const content = rev.content as RevisionContent;
  const rows = await repo.evidenceOf(ex, rev.id);
  const checks = (await checksOfPlan(ex, planId)).filter((c) => c.revision === n);
  const last = checks.at(-1)?.check;
  const key = signingKey(deps.config.signingKeyFile);
  const proofs = await checkedProofs(ex, key, planId, n, rev.id);
  return {
    revision: n,
    state: rev.state,
    proof: rev.proof,
    trainedContext: content.model.trainedContext,
    targetContext: content.targetContext,
    rotaryFingerprint: fingerprintOfRow(rev),
    contentHash: rev.contentHash,
    evidence: rows.map((e) => toEvidence(n, e)),
    criteria: verdicts(
      content.acceptance,
      rows.map((e) => ({ id: e.id, kind: e.kind, rows: e.rows, provenance: e.provenance as Provenance })),
      {
        trainedContext: content.model.trainedContext,
        parity: last ? { passed: last.passed, maxRelativeError: last.maxRelativeError } : null,
      },
    ),
    proofs,
  };
}

export async function listEvidence(deps: AppDeps, planId: number, n: number) {
  return revisionEvidence(deps.db, deps, planId, n);
}

export async function evidenceDownload(deps: AppDeps, planId: number, n: number, id: number) {
  await mustPlan(deps.db, planId);
  const rev = await mustRevision(deps.db, planId, n);
  const f = await repo.evidenceFile(deps.db, rev.id, id);
  if (!f) throw new NotFound(`revision ${n} has no evidence ${id}`);
  return { fileName: f.fileName, text: f.content.toString("utf8"), format: f.format };
}
