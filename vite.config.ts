import { defineConfig } from "vite";
import react from "@vitejs/plugin-react";
import tailwindcss from "@tailwindcss/vite";
import { fileURLToPath } from "node:url";

/** `@/` is client/src and `@shared/` is shared/ (the same paths as tsconfig.json), so imports never climb folders. */
export const alias = {
  "@/": fileURLToPath(new URL("./client/src/", import.meta.url)),
  "@shared/": fileURLToPath(new URL("./shared/", import.meta.url)),
};

export default defineConfig({
  root: "client",
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  build: {
    outDir: "../dist/client",
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // Libraries change less often than our code: separate chunks stay cached across releases.
        codeSplitting: {
          groups: [
            { name: "react", test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom)[\\/]/ },
            { name: "vendor", test: /node_modules[\\/]/ },
          ],
        },
      },
    },
  },
  server: { port: 5173, proxy: { "/api": "http://127.0.0.1:3000" } },
});
