import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { compression } from 'vite-plugin-compression2';

const root = path.dirname(fileURLToPath(import.meta.url));

export default defineConfig({
  root: path.join(root, 'client'),
  publicDir: path.join(root, 'client', 'public'),
  resolve: {
    alias: {
      '@shared': path.join(root, 'shared'),
      '@client': path.join(root, 'client', 'src'),
    },
  },
  plugins: [
    react(),
    // brotli and gzip copies of every text asset, made once at build time; the server sends the one
    // the browser accepts (express-static-gzip in server/app.ts)
    compression({ algorithms: ['brotliCompress', 'gzip'], include: /\.(js|mjs|css|html|svg|json|webmanifest|txt)$/, threshold: 512 }),
    tailwindcss(),
    VitePWA({
      // A new version is offered to the user, never forced (client/src/offline/pwa.ts asks).
      registerType: 'prompt',
      injectRegister: false,
      includeAssets: ['favicon.svg', 'icons/*.png'],
      manifest: {
        name: 'Brineline',
        short_name: 'Brineline',
        description: 'Flooding loads on bulkheads, decks, hatches and patches, computed on deck.',
        theme_color: '#0b2239',
        background_color: '#f7f5ef',
        display: 'standalone',
        start_url: '/',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff,woff2,webmanifest}'],
        maximumFileSizeToCacheInBytes: 6 * 1024 * 1024,
        navigateFallback: '/index.html',
        // API calls and brief links always go to the network, never to the shell cache.
        navigateFallbackDenylist: [/^\/api\//, /^\/brief\//],
        cleanupOutdatedCaches: true,
      },
    }),
  ],
  // the engine worker (features/workspace/worker) is a module worker, split into chunks like the page
  worker: { format: 'es' },
  build: {
    outDir: path.join(root, 'dist', 'client'),
    emptyOutDir: true,
    sourcemap: false,
    chunkSizeWarningLimit: 1500,
  },
  server: {
    port: 5173,
    proxy: { '/api': { target: `http://localhost:${process.env.PORT ?? 3000}`, changeOrigin: false } },
  },
});
