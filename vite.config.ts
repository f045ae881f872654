import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import path from 'node:path';

const apiProxy = {
  '/api': { target: 'http://127.0.0.1:8080', changeOrigin: false },
};

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: {
    // Regexes, not bare '@', so scoped packages such as '@tanstack/…' are never rewritten.
    alias: [
      { find: /^@shared\//, replacement: `${path.resolve(import.meta.dirname, 'shared')}/` },
      { find: /^@\//, replacement: `${path.resolve(import.meta.dirname, 'src')}/` },
    ],
  },
  server: { host: '127.0.0.1', port: 5173, proxy: apiProxy },
  preview: { host: '127.0.0.1', port: 4173, proxy: apiProxy },
  build: { outDir: 'dist', emptyOutDir: true, sourcemap: true },
});
