import './early-asks';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import '@fontsource/manrope/latin-400.css';
import '@fontsource/manrope/latin-600.css';
import '@fontsource/manrope/latin-700.css';
import '@fontsource/manrope/latin-800.css';
import './styles.css';
import { createQueryClient } from './lib/query-client';
import { createAppRouter } from './app/router';
import { AppProviders } from './app/providers';

const container = document.getElementById('root');
if (!container) throw new Error('index.html must contain <div id="root"> for Kerfline to start');

const queryClient = createQueryClient();
const router = createAppRouter(queryClient);

createRoot(container).render(
  <StrictMode>
    <AppProviders queryClient={queryClient} router={router} />
  </StrictMode>,
);
