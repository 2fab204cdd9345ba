import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The client lives in client/; the server serves dist/client in production and
// proxies nothing. In `npm run dev` Vite forwards API, IIIF and font requests to it.
const apiPort = process.env.PORT ?? '3000';
const target = `http://127.0.0.1:${apiPort}`;

export default defineConfig({
  root: 'client',
  plugins: [react(), tailwindcss()],
  build: { outDir: '../dist/client', emptyOutDir: true, chunkSizeWarningLimit: 1500 },
  server: {
    port: 5173,
    strictPort: false,
    proxy: { '/api': target, '/iiif': target, '/fonts': target, '/media': target },
  },
});
