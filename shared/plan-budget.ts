/*
 * The lengths a plan's budget is costed between, read by the server when it freezes a revision's budget
 * (server/features/plans/budget-part.ts) and by the plan's budget sheet while it is edited.
 */

/**
 * From the model's trained length up to the longest of the plan's target and its stages (a stage may train past the
 * target); never below the trained length, which the estimate refuses (trainedContext ≤ targetContext). Lengths not
 * yet typed (NaN, undefined) are left out.
 */
export function planBudgetContexts(
  trainedContext: number,
  targetContext: number | undefined,
  stageLengths: readonly (number | undefined)[],
) {
  const known = [targetContext, ...stageLengths].filter((n): n is number => n !== undefined && Number.isFinite(n));
  return { trainedContext, targetContext: Math.max(trainedContext, ...known) };
}
