import '@fontsource/ibm-plex-sans/400.css';
import '@fontsource/ibm-plex-sans/600.css';
import './index.css';
import { QueryClientProvider } from '@tanstack/react-query';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router';
import { registerSW } from 'virtual:pwa-register';
import { createRouter } from './app/router';
import { onSent, startOutbox } from './features/readings/outbox';
import { queryClient } from './lib/query-client';

// The service worker precaches the app shell so the yard screens open without a connection.
registerSW({ immediate: true });
startOutbox();
onSent(() => {
  void queryClient.invalidateQueries({ queryKey: ['pieces'] });
  void queryClient.invalidateQueries({ queryKey: ['yard'] });
});

const router = createRouter(queryClient);

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>
  </StrictMode>,
);
