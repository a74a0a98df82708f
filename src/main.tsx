import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { config as zodConfig } from 'zod/v4/core';
import '@fontsource-variable/inter';
import '@fontsource/jetbrains-mono/400.css';
import '@fontsource/jetbrains-mono/600.css';
// A fallback face for symbols Inter and JetBrains Mono lack, the DC sign ⎓ (U+2393) of rating
// labels above all; its unicode-range means the file loads only on a page that shows one.
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
