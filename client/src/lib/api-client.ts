import { z } from "zod";
import { apiErrorSchema } from "@shared/schemas/common";
import { apiPaths } from "../config/paths";

/** Every failed request surfaces as this, whatever went wrong (HTTP error, network, unexpected body). */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string> | undefined;

  constructor(status: number, code: string, message: string, fields?: Record<string, string>) {
    super(message);
    this.name = "ApiError";
    this.status = status;
    this.code = code;
    this.fields = fields;
  }
}

export const isApiError = (e: unknown): e is ApiError => e instanceof ApiError;

/*
 * The CSRF token lives in the server session; the client learns it from GET /api/auth/session
 * and from the login response (the session is regenerated there), and echoes it on every
 * non-GET request. The auth feature is the only writer.
 */
let csrfToken: string | null = null;
export function setCsrfToken(token: string | null) {
  csrfToken = token;
}

type Method = "GET" | "POST" | "PATCH" | "PUT" | "DELETE";

async function send(
  method: Method,
  url: string,
  body?: unknown,
  signal?: AbortSignal,
  retried = false,
): Promise<Response> {
  const headers: Record<string, string> = { Accept: "application/json" };
  // A FormData body (file upload) sets its own multipart Content-Type with the boundary.
  const isForm = typeof FormData !== "undefined" && body instanceof FormData;
  if (body !== undefined && !isForm) headers["Content-Type"] = "application/json";
  if (method !== "GET" && csrfToken) headers["X-CSRF-Token"] = csrfToken;
  let res: Response;
  try {
    res = await fetch(url, {
      method,
      headers,
      credentials: "same-origin",
      body: body === undefined ? undefined : isForm ? body : JSON.stringify(body),
      signal,
    });
  } catch (e) {
    if (signal?.aborted) throw e;
    throw new ApiError(0, "network", "Could not reach the Ropewalk server. Check your connection and try again.");
  }
  if (!res.ok) {
    const error = await toApiError(res);
    // The server forgot our token (session expired or store reset): learn the new one and try once more.
    if (error.code === "csrf" && method !== "GET" && !retried && (await refreshCsrfToken())) {
      return send(method, url, body, signal, true);
    }
    throw error;
  }
  return res;
}

const csrfOnlySchema = z.object({ csrfToken: z.string() });

async function refreshCsrfToken(): Promise<boolean> {
  const res = await fetch(apiPaths.session(), {
    credentials: "same-origin",
    headers: { Accept: "application/json" },
  }).catch(() => null);
  const parsed = csrfOnlySchema.safeParse(await res?.json().catch(() => null));
  if (!parsed.success) return false;
  csrfToken = parsed.data.csrfToken;
  return true;
}

async function toApiError(res: Response): Promise<ApiError> {
  const json: unknown = await res.json().catch(() => null);
  const parsed = apiErrorSchema.safeParse(json);
  if (parsed.success) {
    const { code, message, fields } = parsed.data.error;
    return new ApiError(res.status, code, message, fields);
  }
  const fallback =
    res.status === 429 ? "Too many requests; wait a moment and try again." : `Request failed (${res.status}).`;
  return new ApiError(res.status, `http_${res.status}`, fallback);
}

async function parseBody<S extends z.ZodType>(res: Response, schema: S): Promise<z.output<S>> {
  const json: unknown = await res.json().catch(() => undefined);
  const parsed = schema.safeParse(json);
  // A body that breaks the shared contract is a bug on one side; say so instead of rendering garbage.
  if (!parsed.success)
    throw new ApiError(res.status, "unexpected_response", "The server sent a response this page does not understand.");
  return parsed.data;
}

export const apiClient = {
  async get<S extends z.ZodType>(url: string, schema: S, signal?: AbortSignal): Promise<z.output<S>> {
    return parseBody(await send("GET", url, undefined, signal), schema);
  },
  /** A write whose response body is checked against `schema`. */
  async send<S extends z.ZodType>(
    method: Exclude<Method, "GET">,
    url: string,
    body: unknown,
    schema: S,
  ): Promise<z.output<S>> {
    return parseBody(await send(method, url, body), schema);
  },
  /**
   * A POST whose answer is read as a stream (server-sent events). Same CSRF header, retry and error mapping
   * as every other write; the caller reads `response.body` and aborts `signal` to cancel.
   */
  async openStream(url: string, body: unknown, signal: AbortSignal): Promise<Response> {
    return send("POST", url, body, signal);
  },
  /** A write answered with 204 No Content (undefined), or with a body checked against `schema`. */
  async sendMaybeContent<S extends z.ZodType>(
    method: Exclude<Method, "GET">,
    url: string,
    schema: S,
    body?: unknown,
  ): Promise<z.output<S> | undefined> {
    const res = await send(method, url, body);
    return res.status === 204 ? undefined : parseBody(res, schema);
  },
  /** A write answered with 204 No Content. */
  async sendNoContent(method: Exclude<Method, "GET">, url: string, body?: unknown): Promise<void> {
    await send(method, url, body);
  },
};
