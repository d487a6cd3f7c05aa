import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

/** The path aliases of tsconfig.json (tsx reads them there; Vite and Vitest here). */
export const aliases = {
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@': fileURLToPath(new URL('./src', import.meta.url)),
};

const apiPort = process.env.PORT ?? '3000';
const apiHost = process.env.HOST ?? '127.0.0.1';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias: aliases },
  server: {
    port: 5173,
    proxy: { '/api': `http://${apiHost}:${apiPort}` },
  },
  // The sheet editor (with the canvas library) is split off by the router's lazy route. The main
  // chunk (about 560 kB before gzip, 170 kB after) is mostly react-dom, react-router and zod.
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 600 },
});
