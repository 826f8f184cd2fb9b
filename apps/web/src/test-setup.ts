import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// vitest runs without globals, so Testing Library cannot register its own cleanup: unmount after every test,
// and take away any fake network a test installed.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

// Pages load their code and data lazily; on a busy two-core machine the first render of a page can take longer
// than Testing Library's default second. Three seconds keeps the tests about behaviour, not the machine's load.
configure({ asyncUtilTimeout: 3000 });
