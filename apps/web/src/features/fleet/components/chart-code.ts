type ChartCode = typeof import('./charts');

let loading: Promise<ChartCode> | undefined;
let loaded: ChartCode | undefined;

/**
 * Loads the chart code (its own chunk, with the chart library) once for the whole visit. A screen with charts
 * calls it as its route matches, so the chunk arrives while the figures are still on their way rather than
 * after them. A failed load is forgotten, so the next call tries the network again.
 */
export function loadChartCode(): Promise<ChartCode> {
  loading ??= import('./charts').then(
    (code) => {
      loaded = code;
      return code;
    },
    (error: unknown) => {
      loading = undefined;
      throw error;
    },
  );
  return loading;
}

/** The chart code if it has already arrived: a panel then draws at once instead of suspending for a turn. */
export function loadedChartCode(): ChartCode | undefined {
  return loaded;
}
