import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach, vi } from 'vitest';

// Routes load lazily and the machine that runs CI may be busy: give findBy* and waitFor up to 10 s (the default is
// 1 s) before a missing element counts as missing: on a loaded two-core machine a lazy page's first render can take
// several seconds.
configure({ asyncUtilTimeout: 10_000 });

// vitest runs without globals, so Testing Library cannot register its own cleanup: unmount after every test,
// and take away any fake network a test installed.
afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});
