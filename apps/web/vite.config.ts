import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The API runs beside the dev server; proxying keeps the session cookie same-origin.
const apiProxy = { '/api': { target: 'http://127.0.0.1:8080', changeOrigin: false } };

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: { port: 5173, strictPort: true, proxy: apiProxy },
  preview: { port: 4173, strictPort: true, proxy: apiProxy },
  build: { outDir: 'dist', emptyOutDir: true },
});
