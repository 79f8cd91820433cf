// Baseline for the API-overhead figure of `npm run bench`: a bare Express app answering one POST route with a fixed
// JSON body (the analysis answer the real app gives), no session, database or engine. It parses the request body and
// serialises and compresses the answer on every request, with the `compression` middleware at the levels the app
// uses for dynamic JSON (passed in by bench/speed.bench.ts from server/platform/prepared-json.ts), so both send the
// same bytes. Usage: node … <port> <body file> <gzip level> <brotli quality>
import fs from "node:fs";
import zlib from "node:zlib";
import compression from "compression";
import express from "express";

const [port, bodyFile, gzipLevel, brotliQuality] = process.argv.slice(2);
const body = JSON.parse(fs.readFileSync(bodyFile, "utf8"));
const app = express();
app.use(
  compression({
    level: Number(gzipLevel),
    brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: Number(brotliQuality) } },
  }),
);
app.use(express.json({ limit: "512kb" }));
app.post("/api/analyses", (_req, res) => res.json(body));
app.listen(Number(port), "127.0.0.1", () => console.log("ready"));
