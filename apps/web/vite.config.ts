import { defineConfig, loadEnv } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

export default defineConfig(({ mode }) => {
  // REVLOOP_API_URL lets a second checkout or a test run point at its own API; 8080 is the default.
  const target = loadEnv(mode, '.', 'REVLOOP_').REVLOOP_API_URL ?? 'http://127.0.0.1:8080';
  // The API runs beside the dev server; proxying keeps the session cookie same-origin.
  const proxy = { '/api': { target, changeOrigin: false } };
  return {
    plugins: [react(), tailwindcss()],
    server: { port: 5173, strictPort: true, proxy },
    preview: { port: 4173, strictPort: true, proxy },
    build: { outDir: 'dist', emptyOutDir: true },
  };
});
