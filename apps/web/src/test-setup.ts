import '@testing-library/jest-dom/vitest';
import { cleanup } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// vitest runs without globals, so Testing Library cannot register its own cleanup: unmount after every test,
// and take away any fake network a test installed.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});
