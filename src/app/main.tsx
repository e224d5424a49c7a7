/** Entry: restore shared state from the URL, start the engine worker and the URL sync, render. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './App';
import { store } from './store';
import { startEngine } from './engine';
import { restoreFromUrl, startUrlSync } from './urlSync';
import { perfRecords, renderStats } from './perf';
import { snapshotPng } from './scene/snapshot';
import './styles.css';

restoreFromUrl();
startEngine();
startUrlSync();

// Hooks for the e2e tests and the browser benchmark (read-only use).
(window as unknown as { __atlas: object }).__atlas = { store, perfRecords, renderStats, snapshotPng };

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
