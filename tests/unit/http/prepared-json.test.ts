import zlib from "node:zlib";
import { describe, expect, it } from "vitest";
import { PreparedJson } from "../../../server/platform/prepared-json";

// Identities: gunzip(gzip(x)) = x and brotliDecompress(brotliCompress(x)) = x (RFC 1952, RFC 7932).
describe("PreparedJson compressed off the request thread", () => {
  const value = { pairs: Array.from({ length: 400 }, (_, i) => ({ index: i, theta: 10_000 ** (-i / 400) })) };

  it("gives back bytes that decompress to the JSON, in each encoding", async () => {
    const prepared = new PreparedJson(value);
    expect(zlib.gunzipSync(await prepared.encoded("gzip")).equals(prepared.json)).toBe(true);
    expect(zlib.brotliDecompressSync(await prepared.encoded("br")).equals(prepared.json)).toBe(true);
    expect(JSON.parse(prepared.json.toString("utf8"))).toEqual(value);
  });

  it("compresses once: uses that overlap, and later ones, share one result", async () => {
    const prepared = new PreparedJson(value);
    const [a, b] = [prepared.encoded("gzip"), prepared.encoded("gzip")];
    expect(a).toBe(b);
    expect(await a).toBe(await prepared.encoded("gzip"));
  });
});
