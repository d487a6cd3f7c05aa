import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiPort = process.env.PORT ?? '3000';
const apiHost = process.env.HOST ?? '127.0.0.1';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    port: 5173,
    proxy: { '/api': `http://${apiHost}:${apiPort}` },
  },
  // One app bundle for now (about 0.5 MB before gzip); route-level splitting comes with the canvas editor.
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: true, chunkSizeWarningLimit: 800 },
});
