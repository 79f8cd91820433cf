import { describe, expect, it } from "vitest";
import {
  AppError,
  Conflict,
  Forbidden,
  Invalid,
  NotFound,
  NotSignedIn,
  RateLimited,
  Unavailable,
} from "../../../server/platform/errors";
import { httpStatusOf, STATUS_OF_KIND } from "../../../server/http/error-status";

// Statuses per RFC 9110 §15.5 (400 Bad Request, 401 Unauthorized, 403 Forbidden, 404 Not Found, 409 Conflict),
// §15.6.4 (503 Service Unavailable) and RFC 6585 §4 (429 Too Many Requests).
describe("application errors carry no HTTP; server/http maps their kinds", () => {
  it.each([
    [new Invalid("x", { a: "bad" }), 400, "invalid"],
    [new NotSignedIn(), 401, "unauthorized"],
    [new Forbidden(), 403, "forbidden"],
    [new NotFound(), 404, "not_found"],
    [new Conflict("x"), 409, "conflict"],
    [new RateLimited("x", 30), 429, "too_many_requests"],
    [new Unavailable("busy", "x"), 503, "busy"],
  ] as const)("%s answers %i with code %s", (err, status, code) => {
    expect(err).toBeInstanceOf(AppError);
    expect(httpStatusOf(err)).toBe(status);
    expect(err.code).toBe(code);
    expect(Object.keys(err)).not.toContain("status");
  });

  it("every kind has a client-error or unavailable status", () => {
    for (const status of Object.values(STATUS_OF_KIND))
      expect(status === 503 || (status >= 400 && status < 500)).toBe(true);
  });
});
