import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';
import { fileURLToPath } from 'node:url';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // Installable app and offline field view: a web app manifest with the icons in public/icons, and a
    // service worker (Workbox, generated at build) that precaches the built app. Nothing is fetched
    // from elsewhere at run time; the survey, plan images and planned points taken offline live in
    // IndexedDB (src/features/field/offline/field-db.ts), not in the worker's cache.
    VitePWA({
      injectRegister: false, // registered in src/main.tsx through workbox-window
      registerType: 'autoUpdate',
      includeAssets: ['favicon.svg', 'icons/apple-touch-icon-180.png'],
      manifest: {
        name: 'Luxtrail',
        short_name: 'Luxtrail',
        description: 'Illuminance surveys: measure on site with or without a connection, judge in the office.',
        id: '/',
        start_url: '/field',
        scope: '/',
        display: 'standalone',
        orientation: 'any',
        background_color: '#f5f6f8',
        theme_color: '#141b2d',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        globIgnores: ['samples/**'],
        // Every page of the app is index.html; the API is never answered from the cache.
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        skipWaiting: true,
      },
    }),
  ],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  build: { outDir: 'dist', emptyOutDir: true, manifest: true },
});
