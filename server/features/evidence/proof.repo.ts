import { eq } from "drizzle-orm";
import { planRevisions } from "../../db/schema";
import type { Executor } from "../../db/client";
import type { ProofState } from "../../../shared/schemas/evidence-api";

/** The revision's proof state follows its latest proof decision (CHECK: only approved or superseded revisions). */
export const updateProof = (ex: Executor, revisionId: number, proof: ProofState) =>
  ex.update(planRevisions).set({ proof, updatedAt: new Date() }).where(eq(planRevisions.id, revisionId));
