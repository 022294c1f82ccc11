import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The console: a single-page app served by our own server from dist/.
export default defineConfig({
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: true },
  server: { proxy: { '/v1': 'http://127.0.0.1:3000', '/console-api': 'http://127.0.0.1:3000', '/openapi.json': 'http://127.0.0.1:3000' } },
});
