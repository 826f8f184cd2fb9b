import { describe, expect, it } from 'vitest';
import { forPeople } from './form-errors';

describe('server messages for people', () => {
  it('names a clashing record by what the message says of it, not by its id', () => {
    expect(
      forPeople(
        'This stop overlaps stop 5d0c2b1e-7a3f-4e9a-b6c5-0f1d2e3a4b55 (hydraulic, open since 2 Dec 2026, 03:10 (America/Toronto)); end that stop first or change these times',
      ),
    ).toBe(
      'This stop overlaps the stop (hydraulic, open since 2 Dec 2026, 03:10 (America/Toronto)); end that stop first or change these times',
    );
    expect(forPeople('These times overlap blade run 5D0C2B1E-7A3F-4E9A-B6C5-0F1D2E3A4B55 (Fleet 3/4, …)')).toBe(
      'These times overlap the blade run (Fleet 3/4, …)',
    );
    expect(forPeople('Quantity must be at least 1 blade')).toBe('Quantity must be at least 1 blade');
  });
});
