import fs from "node:fs";
import path from "node:path";
import zlib from "node:zlib";
import { defineConfig, type Plugin } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { fileURLToPath } from "node:url";

/** `@/` is client/src and `@shared/` is shared/ (the same paths as tsconfig.json), so imports never climb folders. */
export const alias = {
  "@/": fileURLToPath(new URL("./client/src/", import.meta.url)),
  "@shared/": fileURLToPath(new URL("./shared/", import.meta.url)),
};

/** Text assets are worth compressing; fonts (woff2 is already compressed) and images are not. */
const COMPRESSIBLE = /\.(js|css|html|svg|json|txt|map)$/;

/**
 * Writes `<file>.br` (brotli, quality 11) and `<file>.gz` (gzip, level 9) beside each text asset of the build, once at
 * build time, so the server sends them as they are (express-static-gzip) instead of compressing per request.
 */
function precompress(): Plugin {
  let outDir = "";
  return {
    name: "ropewalk-precompress",
    apply: "build",
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    closeBundle() {
      const walk = (dir: string): string[] =>
        fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
          const p = path.join(dir, e.name);
          return e.isDirectory() ? walk(p) : [p];
        });
      for (const file of walk(outDir).filter((f) => COMPRESSIBLE.test(f))) {
        const raw = fs.readFileSync(file);
        if (raw.length < 1024) continue;
        fs.writeFileSync(
          `${file}.br`,
          zlib.brotliCompressSync(raw, {
            params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 11, [zlib.constants.BROTLI_PARAM_SIZE_HINT]: raw.length },
          }),
        );
        fs.writeFileSync(`${file}.gz`, zlib.gzipSync(raw, { level: 9 }));
      }
    },
  };
}

export default defineConfig({
  root: "client",
  plugins: [react(), tailwindcss(), precompress()],
  resolve: { alias },
  build: {
    outDir: "../dist/client",
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // React changes less often than our code: its own chunk stays cached across releases. Other libraries go
        // with the route chunks that use them (charts with the workbench and plan charts, tables with the lists),
        // so the first page does not pull them in.
        codeSplitting: {
          groups: [
            { name: "react", test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom)[\\/]/ },
          ],
        },
      },
    },
  },
  server: { port: 5173, proxy: { "/api": "http://127.0.0.1:3000" } },
});
