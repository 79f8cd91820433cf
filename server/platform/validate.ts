import { z } from "zod";
import { Invalid } from "./errors";
import { assertNotHostile } from "./hostile";

/** Turns zod issues into { "a.b.0": "message" } so every bad field is named. */
export function issuesToFields(error: z.ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join(".") : "(body)";
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

export function parseOr400<S extends z.ZodType>(schema: S, value: unknown, what = "request"): z.infer<S> {
  // NUL characters and runaway nesting are refused before zod (and then PostgreSQL) sees them.
  assertNotHostile(value, what);
  const result = schema.safeParse(value);
  if (!result.success) {
    const fields = issuesToFields(result.error);
    throw new Invalid(`invalid ${what}: ${Object.keys(fields).join(", ")}`, fields);
  }
  return result.data;
}
