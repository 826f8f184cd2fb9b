import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// Pages load their code lazily; on a busy two-core machine the first import of a route can take longer than
// Testing Library's default second, so `findBy…` waits up to five.
configure({ asyncUtilTimeout: 5000 });

// vitest runs without globals, so Testing Library cannot register its own cleanup: unmount after every test,
// and take away any fake network a test installed.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});
