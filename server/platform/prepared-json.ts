import { promisify } from "node:util";
import zlib from "node:zlib";

const gzip = promisify(zlib.gzip);
const brotli = promisify(zlib.brotliCompress);

/**
 * How hard dynamic JSON answers are compressed, by the `compression` middleware (server/app.ts) and for prepared
 * answers alike. Measured on the 8-method analysis in the column form (48 kB JSON, `npm run bench -- stages`,
 * docs/scale-figures.md "Analyses request, where the time goes"): gzip level 6 (zlib's default) 0.70 ms → 16.9 kB,
 * level 1 0.38 ms → 17.5 kB; brotli quality 4 (compression 1.8's default) 0.50 ms → 16.0 kB, quality 1 0.12 ms →
 * 16.2 kB. A few per cent more bytes for half to a quarter of the CPU per answer. Built assets are compressed once at
 * build time at the highest settings (vite.config.ts) and are not affected.
 */
export const DYNAMIC_GZIP_LEVEL = 1;
export const DYNAMIC_BROTLI_QUALITY = 1;
/** Below this many bytes an answer goes uncompressed (the `compression` middleware's default threshold, 1 kB). */
export const COMPRESS_FROM_BYTES = 1024;

export type JsonEncoding = "br" | "gzip";

/**
 * A JSON answer serialised once and compressed at most once per encoding, for answers served many times (kept
 * analyses): a repeated question then costs neither JSON.stringify nor compression.
 *
 * Only the bytes are kept, serialised at construction: the value's objects are left to the garbage collector while
 * still young, and a long-kept answer is a few buffers outside the JavaScript heap instead of thousands of objects
 * every full collection walks (docs/scale-figures.md "New questions: what repeats between them"). `value` is parsed
 * back from the bytes when read: equal as JSON (serialising it again gives the same bytes), not the same objects.
 */
export class PreparedJson<T = unknown> {
  readonly json: Buffer;
  readonly #encoded = new Map<JsonEncoding, Promise<Buffer>>();

  constructor(value: T) {
    this.json = Buffer.from(JSON.stringify(value), "utf8");
  }

  get value(): T {
    return JSON.parse(this.json.toString("utf8")) as T;
  }

  /**
   * The JSON bytes compressed with `encoding` at the dynamic settings above, compressed on first use. Compression runs
   * on libuv's thread pool (zlib's callback API), not on the thread that answers requests: a new analysis's 48 kB
   * costs about 0.4 ms of gzip, which the main thread then spends on the next request (docs/scale-figures.md
   * "Compressing off the request thread"). Concurrent first uses share one compression.
   */
  encoded(encoding: JsonEncoding): Promise<Buffer> {
    let bytes = this.#encoded.get(encoding);
    if (!bytes) {
      bytes =
        encoding === "br"
          ? brotli(this.json, {
              params: {
                [zlib.constants.BROTLI_PARAM_QUALITY]: DYNAMIC_BROTLI_QUALITY,
                [zlib.constants.BROTLI_PARAM_SIZE_HINT]: this.json.length,
              },
            })
          : gzip(this.json, { level: DYNAMIC_GZIP_LEVEL });
      this.#encoded.set(encoding, bytes);
      // a failed compression is not kept: the next use tries again
      bytes.catch(() => this.#encoded.delete(encoding));
    }
    return bytes;
  }
}
