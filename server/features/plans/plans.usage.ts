import { eq } from "drizzle-orm";
import { plans } from "../../db/schema";
import { registerModelUsage } from "../models/models.repo";

// A profile that plans use cannot be deleted; the models feature asks this query.
registerModelUsage((ex, modelId) => ex.select({ id: plans.id, title: plans.title }).from(plans).where(eq(plans.modelId, modelId)));
