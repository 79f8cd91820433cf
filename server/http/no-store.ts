import type { NextFunction, Request, Response } from "express";

/** For answers that carry secrets or credentials (CSRF tokens, user details, a new token's secret): no cache keeps them. */
export function noStore(_req: Request, res: Response, next: NextFunction) {
  res.set("Cache-Control", "no-store");
  next();
}
