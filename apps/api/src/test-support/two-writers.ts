import pg from 'pg';
import { testDatabaseUrl } from './test-db.js';

/**
 * Two transactions at once, each on a connection of its own: `first` writes and keeps its transaction open while
 * `second` writes; then the first commits, the second finishes and commits. Answers whether the second's write was
 * still waiting 300 ms after it began (that is, it waited for the first).
 */
export async function twoWriters(
  first: (client: pg.Client) => Promise<unknown>,
  second: (client: pg.Client) => Promise<unknown>,
): Promise<{ secondWaited: boolean }> {
  const one = new pg.Client({ connectionString: testDatabaseUrl() });
  const two = new pg.Client({ connectionString: testDatabaseUrl() });
  await Promise.all([one.connect(), two.connect()]);
  try {
    await one.query('BEGIN');
    await two.query('BEGIN');
    await first(one);
    let secondDone = false;
    const writing = second(two).then(() => (secondDone = true));
    await new Promise((resolve) => setTimeout(resolve, 300));
    const secondWaited = !secondDone;
    await one.query('COMMIT');
    await writing;
    await two.query('COMMIT');
    return { secondWaited };
  } finally {
    await Promise.all([one.end(), two.end()]);
  }
}
