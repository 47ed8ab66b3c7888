import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { applyTheme } from './app/theme';
import './app/app.css';
import { AppProvider } from './app/provider';
import { AppRouter } from './app/router';
import { bootstrapSession } from './lib/auth';

applyTheme();
// Start restoring the session from the refresh cookie before the first render.
void bootstrapSession();

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <AppProvider>
      <AppRouter />
    </AppProvider>
  </StrictMode>,
);
