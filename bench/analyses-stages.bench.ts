import crypto from "node:crypto";
import { performance } from "node:perf_hooks";
import zlib from "node:zlib";
import pg from "pg";
import { LOCAL_APP_ROLE } from "../server/config";
import { analyse } from "../server/engine";
import { keyOf } from "../server/features/analyses/analyses.kept";
import { assertNotHostile } from "../server/platform/hostile";
import { packAnalysis } from "../shared/analysis-columns";
import { analysisRequestSchema, analysisResponseSchema, METHOD_IDS } from "../shared/schemas/analysis";
import { anyAnalysisResponseSchema } from "../shared/schemas/analysis-columns";
import { everyMethodQuestion } from "./analysis-question";
import { median } from "./http-client";

// `npm run bench -- stages`: what one POST /api/analyses (8 methods, d = 128) costs, stage by stage, in this process
// (the production server runs the same code compiled): median of RUNS runs each, after WARM warm-up runs. The two
// session-path queries run against the loopback cluster's `ropewalk` database (the speed bench seeds it).
const WARM = 50;
const RUNS = 300;

function time(label: string, f: () => unknown, note = "") {
  for (let i = 0; i < WARM; i++) f();
  const ms: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t = performance.now();
    f();
    ms.push(performance.now() - t);
  }
  console.log(`  ${label.padEnd(58)} ${median(ms).toFixed(3).padStart(8)} ms  ${note}`);
}

async function timeAsync(label: string, f: () => Promise<unknown>, note = "") {
  for (let i = 0; i < WARM; i++) await f();
  const ms: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const t = performance.now();
    await f();
    ms.push(performance.now() - t);
  }
  console.log(`  ${label.padEnd(58)} ${median(ms).toFixed(3).padStart(8)} ms  ${note}`);
}

export async function runStagesBench() {
  const input = { ...everyMethodQuestion(), form: "columns" };
  const raw = JSON.stringify(input);
  console.log(`\nPOST /api/analyses, one request's stages (${METHOD_IDS.length} methods, d = 128; median of ${RUNS})`);
  time("JSON.parse of the request body", () => JSON.parse(raw), `${(raw.length / 1024).toFixed(1)} kB`);
  time("hostile-input scan (NUL, nesting)", () => assertNotHostile(input, "body"));
  const parsed = analysisRequestSchema.parse(input);
  time("zod parse of the request", () => analysisRequestSchema.parse(input));
  const request = {
    model: parsed.model as Extract<typeof parsed.model, { headDim: number }>,
    targetContext: parsed.targetContext,
    bands: parsed.bands,
    methods: parsed.methods,
  };
  time("kept-answer key (canonical JSON of the request)", () => keyOf(request));
  const rows = analyse(request);
  // Each run a new target, as the load bench asks: the engine's kept sub-results (server/engine/memo.ts) then help
  // only where they would for a real new question.
  let moved = 0;
  time("engine compute (a new question: target + 1 each run)", () =>
    analyse({ ...request, targetContext: request.targetContext + ++moved }),
  );
  const cols = packAnalysis(rows);
  time("column form from the rows", () => packAnalysis(rows));
  const rowsJson = JSON.stringify(rows);
  const colsJson = JSON.stringify(cols);
  time("response check, rows (zod; not run in production)", () => analysisResponseSchema.safeParse(rows));
  time("response check, columns (zod; not run in production)", () => anyAnalysisResponseSchema.safeParse(cols));
  time("JSON.stringify, rows", () => JSON.stringify(rows), `${(rowsJson.length / 1024).toFixed(0)} kB`);
  time("JSON.stringify, columns", () => JSON.stringify(cols), `${(colsJson.length / 1024).toFixed(0)} kB`);
  for (const level of [6, 1]) {
    const size = zlib.gzipSync(colsJson, { level }).length;
    time(`gzip level ${level}, columns`, () => zlib.gzipSync(colsJson, { level }), `${(size / 1024).toFixed(1)} kB`);
  }
  for (const quality of [4, 1]) {
    const params = { [zlib.constants.BROTLI_PARAM_QUALITY]: quality };
    const size = zlib.brotliCompressSync(colsJson, { params }).length;
    time(
      `brotli quality ${quality}, columns`,
      () => zlib.brotliCompressSync(colsJson, { params }),
      `${(size / 1024).toFixed(1)} kB`,
    );
  }
  for (const level of [6, 1]) {
    const size = zlib.gzipSync(rowsJson, { level }).length;
    time(`gzip level ${level}, rows`, () => zlib.gzipSync(rowsJson, { level }), `${(size / 1024).toFixed(1)} kB`);
  }
  const q1 = { [zlib.constants.BROTLI_PARAM_QUALITY]: 1 };
  const rowsBr = zlib.brotliCompressSync(rowsJson, { params: q1 }).length;
  time(
    "brotli quality 1, rows",
    () => zlib.brotliCompressSync(rowsJson, { params: q1 }),
    `${(rowsBr / 1024).toFixed(1)} kB`,
  );
  const secret = crypto.randomBytes(24).toString("hex");
  time("session cookie signature check (HMAC-SHA256)", () =>
    crypto.createHmac("sha256", secret).update("0123456789abcdef0123456789abcdef").digest("base64"),
  );

  const pgPort = process.env.PGPORT ?? "54329";
  const client = new pg.Client({ connectionString: `postgres://${LOCAL_APP_ROLE}@127.0.0.1:${pgPort}/ropewalk` });
  await client.connect();
  try {
    const sid = (await client.query<{ sid: string }>("SELECT sid FROM session LIMIT 1")).rows[0]?.sid ?? "none";
    await timeAsync("session row read (connect-pg-simple's SELECT, loopback)", () =>
      client.query("SELECT sess FROM session WHERE sid = $1 AND expire >= to_timestamp($2)", [sid, Date.now() / 1000]),
    );
    await timeAsync("signed-in user read (SELECT users by id, loopback)", () =>
      client.query("SELECT * FROM users WHERE id = $1 LIMIT 1", [1]),
    );
  } finally {
    await client.end();
  }
}
