import { createRoot } from 'react-dom/client';
import { StrictMode } from 'react';
import { App } from './App';
import { pickHost } from './host/pickHost';
import './styles.css';

const host = pickHost();
createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <App host={host} />
  </StrictMode>,
);
