import http from "node:http";
import { performance } from "node:perf_hooks";

// A tiny HTTP client for the speed bench: node:http, so bytes on the wire (before any decoding) can be counted.

export interface RawAnswer {
  status: number;
  headers: http.IncomingHttpHeaders;
  /** bytes as sent (still compressed when Content-Encoding is set) */
  body: Buffer;
  ms: number;
}

const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });

export function send(url: string, opts: { method?: string; headers?: Record<string, string>; body?: string } = {}) {
  return new Promise<RawAnswer>((resolve, reject) => {
    const t = performance.now();
    const req = http.request(url, { method: opts.method ?? "GET", headers: opts.headers, agent }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () =>
        resolve({
          status: res.statusCode ?? 0,
          headers: res.headers,
          body: Buffer.concat(chunks),
          ms: performance.now() - t,
        }),
      );
      res.on("error", reject);
    });
    req.on("error", reject);
    req.end(opts.body);
  });
}

/** Signs a demo account in; returns the headers a JSON POST needs (cookies and the CSRF token). */
export async function signIn(base: string, email: string, password: string, extra: Record<string, string> = {}) {
  const jar = new Map<string, string>();
  const take = (h: http.IncomingHttpHeaders) => {
    for (const c of h["set-cookie"] ?? []) {
      const kv = c.split(";")[0];
      jar.set(kv.slice(0, kv.indexOf("=")), kv.slice(kv.indexOf("=") + 1));
    }
    return [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  };
  const s = await send(`${base}/api/auth/session`, { headers: extra });
  let cookie = take(s.headers);
  const csrf = (JSON.parse(s.body.toString()) as { csrfToken: string }).csrfToken;
  const login = await send(`${base}/api/auth/login`, {
    method: "POST",
    headers: { ...extra, "content-type": "application/json", cookie, "x-csrf-token": csrf },
    body: JSON.stringify({ email, password }),
  });
  if (login.status !== 200) throw new Error(`sign-in answered ${login.status}: ${login.body.toString()}`);
  cookie = take(login.headers);
  const token = (JSON.parse(login.body.toString()) as { csrfToken: string }).csrfToken;
  return { ...extra, "content-type": "application/json", cookie, "x-csrf-token": token };
}

export const median = (xs: number[]) => quantile(xs, 0.5);
export function quantile(xs: number[], p: number) {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(p * s.length))];
}

/** `connections` loops each sending requests until `total` were sent; req/s and latency quantiles. */
export async function load(total: number, connections: number, one: () => Promise<RawAnswer>) {
  const latencies: number[] = [];
  const failures = new Map<number, number>();
  let next = 0;
  const t0 = performance.now();
  await Promise.all(
    Array.from({ length: connections }, async () => {
      while (next++ < total) {
        const t = performance.now();
        // a reset connection counts as a failure (status 0) rather than ending the run
        const r = await one().catch(() => ({ status: 0, ms: performance.now() - t }));
        if (r.status !== 200) failures.set(r.status, (failures.get(r.status) ?? 0) + 1);
        latencies.push(r.ms);
      }
    }),
  );
  const secs = (performance.now() - t0) / 1000;
  const failed = [...failures].map(([status, n]) => `${n}× ${status}`).join(", ");
  return { rps: total / secs, p50: quantile(latencies, 0.5), p99: quantile(latencies, 0.99), failed };
}
