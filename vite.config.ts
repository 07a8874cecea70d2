/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const serverPort = Number(process.env.PORT ?? 3000);

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    // The API accepts changes from this origin in development (DEV_CLIENT_PORT in server/config.ts): keep the port fixed.
    port: 5173,
    strictPort: true,
    // In development the API runs on its own port (on 127.0.0.1 by default); Vite forwards to it.
    // No X-Forwarded-For is added (xfwd stays off), so the local mailbox still answers through this proxy.
    proxy: {
      '/api': `http://127.0.0.1:${serverPort}`,
      '/collab': { target: `ws://127.0.0.1:${serverPort}`, ws: true },
      '/socket.io': { target: `http://127.0.0.1:${serverPort}`, ws: true },
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
  },
  // The synthesis worker (src/lib/synthesis/synthesis-worker.ts) is a module worker that imports shared code.
  worker: {
    format: 'es',
  },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    environment: 'node',
    testTimeout: 30_000,
    hookTimeout: 30_000,
  },
});
