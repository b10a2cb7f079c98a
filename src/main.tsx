import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router/dom';
import { AppProviders } from './app/providers';
import { createRouter } from './app/router';
import './styles.css';

const router = createRouter();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProviders>
      <RouterProvider router={router} />
    </AppProviders>
  </StrictMode>,
);

// The service worker (built by vite-plugin-pwa) keeps the app's files for the offline field view.
if (import.meta.env.PROD && 'serviceWorker' in navigator) {
  void import('workbox-window').then(({ Workbox }) => new Workbox('/sw.js', { scope: '/' }).register()).catch(() => { /* the app works online without it */ });
}
