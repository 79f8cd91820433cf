import { and, eq, isNull, sql } from "drizzle-orm";
import type { Db } from "../../db/client";
import { baseSearchResults } from "../../db/schema";
import type { SmallestBaseResponse } from "../../../shared/schemas/bounds";

/** What a smallest-base answer depends on (plus the engine version, so a changed engine never serves old answers). */
export interface SearchKey {
  engineVersion: string;
  rotaryDim: number;
  targetContext: number;
  grid: { from: number; to: number; perDecade: number };
}

/** A claim not refreshed for this long belongs to an instance that died; another instance takes it over. */
export const CLAIM_STALE_MS = 10_000;
/** How often the computing instance refreshes its claim, and how often a waiting instance looks again. */
export const CLAIM_REFRESH_MS = 2_000;
export const CLAIM_POLL_MS = 150;

const keyWhere = (k: SearchKey) =>
  and(
    eq(baseSearchResults.engineVersion, k.engineVersion),
    eq(baseSearchResults.rotaryDim, k.rotaryDim),
    eq(baseSearchResults.targetContext, k.targetContext),
    eq(baseSearchResults.gridFrom, k.grid.from),
    eq(baseSearchResults.gridTo, k.grid.to),
    eq(baseSearchResults.gridPerDecade, k.grid.perDecade),
  );

/** The kept answer, or null when there is none yet (a claim in progress is not an answer). */
export async function findKept(db: Db, k: SearchKey): Promise<SmallestBaseResponse | null> {
  const [row] = await db.select({ answer: baseSearchResults.answer }).from(baseSearchResults).where(keyWhere(k));
  return (row?.answer as SmallestBaseResponse | null | undefined) ?? null;
}

/**
 * Claims the right to compute this key: true when this caller inserted the claim or took over a stale one.
 * The primary key makes the insert the lock: of two instances asking at once, exactly one gets the row.
 */
export async function claim(db: Db, k: SearchKey): Promise<boolean> {
  const claimed = await db
    .insert(baseSearchResults)
    .values({
      engineVersion: k.engineVersion,
      rotaryDim: k.rotaryDim,
      targetContext: k.targetContext,
      gridFrom: k.grid.from,
      gridTo: k.grid.to,
      gridPerDecade: k.grid.perDecade,
    })
    .onConflictDoUpdate({
      target: [
        baseSearchResults.engineVersion,
        baseSearchResults.rotaryDim,
        baseSearchResults.targetContext,
        baseSearchResults.gridFrom,
        baseSearchResults.gridTo,
        baseSearchResults.gridPerDecade,
      ],
      set: { claimedAt: sql`now()` },
      setWhere: sql`${baseSearchResults.answer} is null and ${baseSearchResults.claimedAt} < now() - make_interval(secs => ${CLAIM_STALE_MS / 1000})`,
    })
    .returning({ claimedAt: baseSearchResults.claimedAt });
  return claimed.length === 1;
}

/** Keeps the claim fresh while this instance computes. */
export async function refreshClaim(db: Db, k: SearchKey) {
  await db
    .update(baseSearchResults)
    .set({ claimedAt: sql`now()` })
    .where(and(keyWhere(k), isNull(baseSearchResults.answer)));
}

export async function keepAnswer(db: Db, k: SearchKey, answer: SmallestBaseResponse) {
  await db
    .update(baseSearchResults)
    .set({ answer, computedAt: sql`now()` })
    .where(keyWhere(k));
}

/** Gives the claim up (the computation failed or was cancelled) so another caller may compute. */
export async function dropClaim(db: Db, k: SearchKey) {
  await db.delete(baseSearchResults).where(and(keyWhere(k), isNull(baseSearchResults.answer)));
}
