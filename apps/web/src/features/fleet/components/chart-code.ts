import { useEffect, useState } from 'react';

type ChartCode = typeof import('./charts');

let loading: Promise<ChartCode> | undefined;
let loaded: ChartCode | undefined;
let failed = false;

/**
 * Loads the chart code (its own chunk, with the chart library) once for the whole visit. A screen with charts
 * calls it as its route matches, so the chunk arrives while the figures are still on their way rather than
 * after them. A failed load stays failed (every panel shows it, and nothing asks the network again on its own)
 * until `forgetFailedChartCode` is called.
 */
export function loadChartCode(): Promise<ChartCode> {
  loading ??= import('./charts').then(
    (code) => {
      loaded = code;
      return code;
    },
    (error: unknown) => {
      failed = true;
      throw error;
    },
  );
  return loading;
}

/** The chart code if it has already arrived: a panel then draws at once instead of suspending for a turn. */
export function loadedChartCode(): ChartCode | undefined {
  return loaded;
}

/** After a failed load, lets the next `loadChartCode` ask the network again ("Try again", or a new visit to a page). */
export function forgetFailedChartCode(): void {
  if (!failed) return;
  failed = false;
  loading = undefined;
}

/**
 * Follows the chart code: 'coming' until it arrives, then 'here' (or 'failed'). A panel shows its own loading
 * state while the code is coming and draws with an ordinary render once it is here, rather than suspending: React
 * holds back what a suspended boundary reveals by up to a few hundred milliseconds, and the first chart would wait.
 */
export function useChartCode(): 'coming' | 'here' | 'failed' {
  const [state, setState] = useState<'coming' | 'here' | 'failed'>(() =>
    loaded !== undefined ? 'here' : failed ? 'failed' : 'coming',
  );
  useEffect(() => {
    if (state !== 'coming') return;
    let live = true;
    loadChartCode().then(
      () => live && setState('here'),
      () => live && setState('failed'),
    );
    return () => {
      live = false;
    };
  }, [state]);
  return state;
}
