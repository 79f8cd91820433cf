/**
 * The file a worker thread should load for `<name>.ts` beside `importMetaUrl`. Built (dist/server, plain .js) the
 * compiled `<name>.js` is loaded directly; from source (tsx in development, vitest) a small `<name>-boot.mjs`
 * registers tsx inside the thread first, because Node 20 does not apply `--import tsx` to a worker's entry module.
 */
export function workerEntry(importMetaUrl: string, name: string): string {
  const built = importMetaUrl.endsWith(".js");
  return new URL(built ? `./${name}.js` : `./${name}-boot.mjs`, importMetaUrl).href;
}
