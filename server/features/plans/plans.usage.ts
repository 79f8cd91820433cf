import { eq } from "drizzle-orm";
import type { Executor } from "../../db/client";
import { plans } from "../../db/schema";

/** The plans that use a model profile; server/app.ts hands this to the models feature, which refuses to delete such a profile. */
export const plansUsingModel = (ex: Executor, modelId: number) =>
  ex.select({ id: plans.id, title: plans.title }).from(plans).where(eq(plans.modelId, modelId));
