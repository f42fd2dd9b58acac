import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { AppProvider } from './app/provider';
import { router } from './app/router';
import { registerPwa } from './offline/pwa';
import { startSync } from './offline/sync';
import { requestPersistentStorage } from './offline/storage';
import './styles.css';

// The device store is the source of truth on deck: ask the browser not to evict it, keep the
// outbox draining, and offer (never force) new versions of the app.
void requestPersistentStorage();
startSync();
// By mode, not PROD: a build made under NODE_ENV=test (the browser tests) must still register it.
if (import.meta.env.MODE !== 'development') registerPwa();

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);
