import type { NextFunction, Request, Response } from "express";
import { assertNotHostile } from "../platform/hostile";

/** Central guard after the JSON body parser: the parsed body and the query string. */
export function rejectHostileInput(req: Request, _res: Response, next: NextFunction) {
  try {
    assertNotHostile(req.query, "query");
    assertNotHostile(req.body, "body");
    next();
  } catch (e) {
    next(e);
  }
}
