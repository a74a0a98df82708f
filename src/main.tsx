import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { config as zodConfig } from 'zod/v4/core';
import '@fontsource-variable/inter';
import '@fontsource/jetbrains-mono/400.css';
import '@fontsource/jetbrains-mono/600.css';
// Fallback faces for symbols Inter and JetBrains Mono lack. The DC sign ⎓ (U+2393) of rating labels
// is in Noto Sans Symbols (not in Symbols 2); a browser fetches a fallback face only for text that needs it.
import '@fontsource/noto-sans-symbols/symbols-400.css';
import '@fontsource/noto-sans-symbols-2/symbols-400.css';
import './index.css';
import { App } from './app/index.tsx';
import { initTheme } from './lib/theme.ts';

initTheme();
// The CSP forbids eval: zod must not compile parsers with new Function (even its probe for that is reported).
zodConfig({ jitless: true });

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
