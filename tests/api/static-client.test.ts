import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import zlib from "node:zlib";
import request from "supertest";
import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { IMMUTABLE, isHashedAsset } from "../../server/http/static-client";
import { testConfig } from "../setup/app";
import { testDb } from "../setup/db";

// A small client build laid out as Vite writes it, with the .br/.gz twins the build step adds (vite.config.ts).
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "ropewalk-client-"));
const script = `export const strand = ${JSON.stringify("hemp ".repeat(2000))};\n`;
fs.mkdirSync(path.join(dir, "assets"));
fs.writeFileSync(path.join(dir, "index.html"), `<!doctype html><title>Ropewalk</title><div id="root"></div>`);
fs.writeFileSync(path.join(dir, "assets/index-Ab3_x-9Z.js"), script);
fs.writeFileSync(path.join(dir, "assets/index-Ab3_x-9Z.js.br"), zlib.brotliCompressSync(script));
fs.writeFileSync(path.join(dir, "assets/index-Ab3_x-9Z.js.gz"), zlib.gzipSync(script));
fs.writeFileSync(path.join(dir, "robots.txt"), "User-agent: *\n");

const { pool, db } = testDb();
const app = createApp({ config: testConfig({ clientDir: dir }), pool, db });

/** The body as bytes (superagent has already undone Content-Encoding; Content-Length tells what was on the wire). */
const raw = (req: request.Test) =>
  req.buffer(true).parse((res, cb) => {
    const chunks: Buffer[] = [];
    res.on("data", (c: Buffer) => chunks.push(c));
    res.on("end", () => cb(null, Buffer.concat(chunks)));
  });

describe("the built client", () => {
  it("sends the brotli twin of a hashed asset to a browser that accepts br, cached immutably", async () => {
    const r = await raw(request(app).get("/assets/index-Ab3_x-9Z.js").set("Accept-Encoding", "gzip, deflate, br"));
    expect(r.status).toBe(200);
    expect(r.headers["content-encoding"]).toBe("br");
    expect(r.headers["content-type"]).toMatch(/javascript/);
    expect(r.headers["vary"]).toMatch(/Accept-Encoding/i);
    expect(r.headers["cache-control"]).toBe(IMMUTABLE);
    expect(Number(r.headers["content-length"])).toBe(fs.statSync(path.join(dir, "assets/index-Ab3_x-9Z.js.br")).size);
    expect((r.body as Buffer).toString()).toBe(script);
  });

  it("sends the gzip twin to a browser without br, and the plain file to one that accepts neither", async () => {
    const gz = await raw(request(app).get("/assets/index-Ab3_x-9Z.js").set("Accept-Encoding", "gzip"));
    expect(gz.headers["content-encoding"]).toBe("gzip");
    expect(Number(gz.headers["content-length"])).toBe(fs.statSync(path.join(dir, "assets/index-Ab3_x-9Z.js.gz")).size);
    expect((gz.body as Buffer).toString()).toBe(script);
    expect(gz.headers["cache-control"]).toBe(IMMUTABLE);
    const plain = await raw(request(app).get("/assets/index-Ab3_x-9Z.js").set("Accept-Encoding", "identity"));
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect((plain.body as Buffer).toString()).toBe(script);
    expect(plain.headers["cache-control"]).toBe(IMMUTABLE);
  });

  it("never caches index.html or unhashed files immutably", async () => {
    for (const url of ["/", "/workbench", "/plans/12"]) {
      const r = await request(app).get(url);
      expect(r.status).toBe(200);
      expect(r.text).toContain('<div id="root">');
      expect(r.headers["cache-control"]).toBe("no-cache");
    }
    const robots = await request(app).get("/robots.txt");
    expect(robots.status).toBe(200);
    expect(robots.headers["cache-control"]).not.toMatch(/immutable/);
  });

  it("tells hashed asset names from others", () => {
    expect(isHashedAsset("assets/react-CCtu0itp.js")).toBe(true);
    expect(isHashedAsset("assets/ibm-plex-sans-latin-400-normal-CDDApCn2.woff2")).toBe(true);
    expect(isHashedAsset("assets/index-DAUbzW_H.css.br")).toBe(true);
    expect(isHashedAsset("index.html")).toBe(false);
    expect(isHashedAsset("robots.txt")).toBe(false);
    expect(isHashedAsset("assets/notes.txt")).toBe(false);
  });
});

describe("API answers", () => {
  it("are compressed when the client accepts it (gzip, decoded to the same JSON)", async () => {
    const zipped = await raw(request(app).get("/api/openapi.json").set("Accept-Encoding", "gzip"));
    expect(zipped.status).toBe(200);
    expect(zipped.headers["content-encoding"]).toBe("gzip");
    const plain = await request(app).get("/api/openapi.json").set("Accept-Encoding", "identity");
    expect(plain.headers["content-encoding"]).toBeUndefined();
    expect(JSON.parse((zipped.body as Buffer).toString())).toEqual(plain.body);
  });
});
