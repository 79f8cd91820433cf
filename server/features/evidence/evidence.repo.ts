import { and, asc, eq } from "drizzle-orm";
import { revisionEvidence, revisionProofs, users } from "../../db/schema";
import type { Executor } from "../../db/client";

export type EvidenceRow = typeof revisionEvidence.$inferSelect;

export const insertEvidence = async (ex: Executor, v: typeof revisionEvidence.$inferInsert) =>
  (await ex.insert(revisionEvidence).values(v).returning())[0];

/** A revision's evidence, oldest first, without the file bytes. */
export const evidenceOf = (ex: Executor, revisionId: number) =>
  ex
    .select({
      id: revisionEvidence.id,
      kind: revisionEvidence.kind,
      fileName: revisionEvidence.fileName,
      format: revisionEvidence.format,
      checksum: revisionEvidence.checksum,
      sizeBytes: revisionEvidence.sizeBytes,
      rows: revisionEvidence.rows,
      fingerprint: revisionEvidence.fingerprint,
      provenance: revisionEvidence.provenance,
      byUserId: revisionEvidence.byUserId,
      via: revisionEvidence.via,
      createdAt: revisionEvidence.createdAt,
      byName: users.name,
    })
    .from(revisionEvidence)
    .innerJoin(users, eq(users.id, revisionEvidence.byUserId))
    .where(eq(revisionEvidence.revisionId, revisionId))
    .orderBy(asc(revisionEvidence.id));
export type EvidenceHead = Awaited<ReturnType<typeof evidenceOf>>[number];

export const evidenceFile = async (ex: Executor, revisionId: number, id: number) =>
  (
    await ex
      .select({
        fileName: revisionEvidence.fileName,
        content: revisionEvidence.content,
        format: revisionEvidence.format,
      })
      .from(revisionEvidence)
      .where(and(eq(revisionEvidence.revisionId, revisionId), eq(revisionEvidence.id, id)))
      .limit(1)
  )[0];

export const insertProof = async (ex: Executor, v: typeof revisionProofs.$inferInsert) =>
  (await ex.insert(revisionProofs).values(v).returning())[0];
