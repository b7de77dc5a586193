import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiPort = Number(process.env.PORT ?? 3000);

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    port: 5173,
    // ws: the hosted simulated boards' WebSocket (/api/sim-board) goes through too.
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false, ws: true } },
  },
  build: { outDir: 'dist', chunkSizeWarningLimit: 1500 },
});
