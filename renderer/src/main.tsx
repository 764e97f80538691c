import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import './design/tokens.css';
import './design/base.css';
import './design/components.css';
import './design/screens.css';
import { App } from './App';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element; the renderer cannot start.');
createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
