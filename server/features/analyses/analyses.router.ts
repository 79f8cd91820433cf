import { route, CLIENT_GONE, type ApiFeature } from "../../http/route";
import { analysisRequestSchema } from "../../../shared/schemas/analysis";
import { anyAnalysisResponseSchema } from "../../../shared/schemas/analysis-columns";
import { getModelShape } from "../models";
import { analyseRequest } from "./analyses.service";
import { AnalysisCancelled } from "./analyses.pool";

/** Mounted at /api/analyses. POST / is a stateless compute; nothing is stored (answers are kept in memory only). */
export const analysesFeature: ApiFeature = {
  prefix: "/analyses",
  tag: "engine",
  routes: [
    route({
      method: "post",
      path: "/",
      summary: "Compare scaling methods pair by pair (stateless)",
      access: "signed-in",
      body: analysisRequestSchema,
      responses: {
        200: anyAnalysisResponseSchema.describe('The row form, or the column form when the body says form: "columns"'),
      },
      handler: async ({ deps, res, user, body }) => {
        const abort = new AbortController();
        // The connection closing before we answered means nobody waits: drop a large analysis still in the pool.
        res.on("close", () => {
          if (!res.writableEnded) abort.abort();
        });
        try {
          return {
            status: 200,
            prepared: await analyseRequest(body, (id) => getModelShape(deps, id), {
              userId: user.id,
              signal: abort.signal,
            }),
          };
        } catch (e) {
          if (e instanceof AnalysisCancelled) return CLIENT_GONE;
          throw e;
        }
      },
    }),
  ],
};
