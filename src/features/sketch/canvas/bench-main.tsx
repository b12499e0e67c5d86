import '../../../index.css';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { CanvasBenchPage } from './bench-page';

// Stand-alone entry of the canvas benchmark (bench.html), built by bench/canvas.ts.
const root = document.getElementById('root');
if (!root) throw new Error('missing #root element');
createRoot(root).render(
  <StrictMode>
    <CanvasBenchPage />
  </StrictMode>,
);
