import type { z } from "zod";
import { issuesToFields } from "../../../server/platform/validate";

/**
 * The field names a route's 400 would carry for this body: the same schema, the same issue-to-field mapping
 * (`parseBody` in server/http/validate.ts), without a user, a session or HTTP per row.
 * The matching tests/api file keeps one HTTP case proving the route really answers that 400.
 */
export function fieldsOf(schema: z.ZodType, body: unknown): string[] {
  const r = schema.safeParse(body);
  return r.success ? [] : Object.keys(issuesToFields(r.error));
}
