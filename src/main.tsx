import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { AppProvider } from './app/provider';
import { router } from './app/router';
import './index.css';
import { registerServiceWorker } from './lib/register-sw';
import { loadLocale } from '@shared/format/date-time';

registerServiceWorker();

// The reader's language for dates before the first screen (English at once; another from the cache).
void loadLocale(navigator.language)
  .catch(() => undefined)
  .then(() =>
    createRoot(document.getElementById('root')!).render(
      <StrictMode>
        <AppProvider>
          <RouterProvider router={router} />
        </AppProvider>
      </StrictMode>,
    ),
  );
