/** A unique-constraint violation (drizzle 0.45 wraps the driver error; its `cause.code` is PostgreSQL's 23505). */
export const isUniqueViolation = (e: unknown) =>
  (e as { cause?: { code?: string } })?.cause?.code === "23505" || (e as { code?: string })?.code === "23505";
