import { healthResponseSchema } from "../../../shared/schemas";
import { route, type ApiFeature } from "../../http/route";

/** Health answers within this long even when the database hangs (the issue asks for 503 within 5 s). */
export const HEALTH_TIMEOUT_MS = 3000;

/** Mounted at /api/health before sessions and tokens: probes need no sign-in. */
export const healthFeature: ApiFeature = {
  prefix: "/health",
  tag: "system",
  routes: [
    route({
      method: "get",
      path: "/",
      summary: "Liveness and database state",
      access: "public",
      responses: {
        200: healthResponseSchema.describe("The database answers"),
        503: healthResponseSchema.describe("The database does not answer (Retry-After: 5)"),
      },
      handler: async ({ deps, res }) => {
        let timer: NodeJS.Timeout | undefined;
        const late = new Promise<never>((_resolve, reject) => {
          timer = setTimeout(() => reject(new Error("health check timed out")), HEALTH_TIMEOUT_MS);
        });
        try {
          await Promise.race([deps.pool.query("SELECT 1"), late]);
          return { status: 200, body: { ok: true, db: "up" as const } };
        } catch {
          res.set("Retry-After", "5");
          return { status: 503, body: { ok: false, db: "down" as const } };
        } finally {
          clearTimeout(timer);
        }
      },
    }),
  ],
};
