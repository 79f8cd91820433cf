import type { AppDeps } from "../../deps";
import { recordAudit } from "../../platform/audit";
import type { SessionUser } from "../../../shared/schemas";
import type { ConformanceCheck, ProbeResult } from "../../../shared/schemas/conformance";
import { mustPlan, mustRevision } from "./plans.service";
import { fingerprintOfRow, type RevisionContent } from "./revision-content";
import { compareProbe, revisionRotary } from "./conformance-compare";
import * as repo from "./conformance.repo";
import { engineMethod } from "../../../shared/lineage";

/**
 * Records a probe result as a conformance check on revision n: compared with the revision's own θ′ and attention
 * factor (every rotating layer group of a layered revision), written with its audit event in one transaction (the revision row locked, so a draft edit cannot slip
 * between the comparison and the record).
 */
export async function recordCheck(
  deps: AppDeps,
  actor: SessionUser,
  planId: number,
  n: number,
  probe: ProbeResult,
  via: "session" | "token",
): Promise<ConformanceCheck> {
  return deps.db.transaction(async (tx) => {
    await mustPlan(tx, planId);
    const rev = await mustRevision(tx, planId, n, true);
    const content = rev.content as RevisionContent;
    const method = engineMethod(content, content.method);
    const rotary = revisionRotary(content.model, content.targetContext, method, content.groupMethods);
    const result = compareProbe(rotary, probe);
    // Whether the probe was pointed at this revision (the fingerprint the plan page's probe command carries).
    const fingerprintMatches = probe.planFingerprint === null ? null : probe.planFingerprint === fingerprintOfRow(rev);
    const at = new Date();
    const id = await repo.insertCheck(tx, {
      planId,
      revisionId: rev.id,
      contentHash: rev.contentHash,
      byUserId: actor.id,
      via,
      ...result,
      library: probe.library,
      libraryVersion: probe.libraryVersion,
      ropeType: probe.ropeType,
      runningLength: probe.runningLength,
      planFingerprint: probe.planFingerprint,
      readFingerprint: probe.readFingerprint,
      fingerprintMatches,
      upload: probe,
      createdAt: at,
    });
    await recordAudit(tx, {
      actorId: actor.id,
      action: "conformance.recorded",
      subjectType: "plan",
      subjectId: planId,
      detail: {
        revision: n,
        check: id,
        via,
        passed: result.passed,
        maxRelativeError: result.maxRelativeError,
        worstPair: result.worstPair,
        groups: result.groups?.map((g) => ({ kind: g.kind, passed: g.passed })) ?? null,
        library: `${probe.library} ${probe.libraryVersion}`,
        readFingerprint: probe.readFingerprint,
      },
    });
    return {
      id,
      revision: n,
      contentHash: rev.contentHash,
      ...result,
      library: probe.library,
      libraryVersion: probe.libraryVersion,
      ropeType: probe.ropeType,
      runningLength: probe.runningLength,
      planFingerprint: probe.planFingerprint,
      readFingerprint: probe.readFingerprint,
      fingerprintMatches,
      by: { id: actor.id, name: actor.name },
      via,
      at: at.toISOString(),
    };
  });
}

export async function listChecks(deps: AppDeps, planId: number): Promise<{ checks: ConformanceCheck[] }> {
  await mustPlan(deps.db, planId);
  const rows = await repo.checksOfPlan(deps.db, planId);
  return {
    checks: rows.map(({ check: c, revision, byName }) => ({
      id: c.id,
      revision,
      contentHash: c.contentHash,
      passed: c.passed,
      maxRelativeError: c.maxRelativeError,
      worstPair: c.worstPair,
      cause: c.cause,
      library: c.library,
      libraryVersion: c.libraryVersion,
      ropeType: c.ropeType,
      runningLength: c.runningLength,
      planFingerprint: c.planFingerprint,
      readFingerprint: c.readFingerprint,
      fingerprintMatches: c.fingerprintMatches,
      groups: c.groups ?? null,
      by: { id: c.byUserId, name: byName },
      via: c.via,
      at: c.createdAt.toISOString(),
    })),
  };
}
