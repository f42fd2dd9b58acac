import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { AppProvider } from './app/provider';
import { router } from './app/router';
import { registerPwa } from './offline/pwa';
import { requestPersistentStorage } from './offline/storage';
import { rememberedUserId } from './lib/identity';
import './styles.css';

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <AppProvider>
      <RouterProvider router={router} />
    </AppProvider>
  </StrictMode>,
);

// The device store is the source of truth on deck: ask the browser not to evict it, keep the
// outbox draining, and offer (never force) new versions of the app. The sync engine (Dexie, zod)
// is loaded right after the first render, so it does not delay the first screen, and only on a device
// where someone has signed in: a first visit to the sign-in page has nothing to sync and does not
// download it (the sign-in starts it, `acceptSession` in lib/session.tsx).
void requestPersistentStorage();
const afterFirstRender = (fn: () => void) =>
  typeof requestIdleCallback === 'function' ? requestIdleCallback(fn, { timeout: 1000 }) : setTimeout(fn, 0);
afterFirstRender(() => {
  if (rememberedUserId()) void import('./offline/sync').then(({ startSync }) => startSync());
  // By mode, not PROD: a build made under NODE_ENV=test (the browser tests) must still register it.
  if (import.meta.env.MODE !== 'development') registerPwa();
});
