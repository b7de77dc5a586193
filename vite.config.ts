import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const apiPort = Number(process.env.PORT ?? 3000);
// With both TLS files set the API speaks only HTTPS on PORT (server/config.ts), so the proxy must
// too; `secure: false` accepts a lab's self-signed certificate on this loopback hop only.
const apiTls = Boolean(process.env.TLS_CERT_FILE && process.env.TLS_KEY_FILE);

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    port: 5173,
    // ws: the hosted simulated boards' and the stations' WebSockets (/api/…) go through too.
    proxy: { '/api': { target: `${apiTls ? 'https' : 'http'}://127.0.0.1:${apiPort}`, changeOrigin: false, ws: true, secure: false } },
  },
  build: { outDir: 'dist', chunkSizeWarningLimit: 1500 },
});
