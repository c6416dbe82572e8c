import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@/styles/index.css';
import { AppProvider } from '@/app/provider.tsx';
import { AppRouter } from '@/app/router.tsx';
import { applyTheme, watchSystemTheme } from '@/lib/theme.ts';

// The server's CSP allows no inline script, so the stored theme is applied here, before the first render.
applyTheme();
watchSystemTheme();

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
