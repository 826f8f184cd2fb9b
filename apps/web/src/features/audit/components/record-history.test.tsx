import { describe, expect, it } from 'vitest';
import { render, screen } from '@testing-library/react';
import type { AuditEntry } from '@kerfline/domain/audit/schema';
import { RecordHistory, changeLines } from './record-history';

const entry = (overrides: Partial<AuditEntry>): AuditEntry => ({
  id: '0b6f2c1e-6a1d-4c8e-9a52-1f0e7c3d9a01',
  at: '2026-03-04T13:30:00.000Z',
  actorId: null,
  actorName: 'Ines Carvalho',
  siteId: null,
  entity: 'BladeRun',
  entityId: 'x',
  action: 'update',
  before: null,
  after: null,
  ...overrides,
});

describe('a record’s change history', () => {
  it('shows each changed field before and after, on the site’s clock, in words, without the bookkeeping columns', () => {
    const lines = changeLines(
      entry({
        before: { removedAt: null, removalReason: null, removedById: null, breakInFollowed: null },
        after: {
          removedAt: '2026-03-04T15:10:00.000Z',
          removalReason: 'tooth_strippage',
          removedById: 'someone',
          breakInFollowed: false,
        },
      }),
      'America/Chicago',
    );
    expect(lines).toEqual([
      { label: 'Taken off', before: '—', after: 'Mar 4, 2026, 9:10 AM' },
      { label: 'Why it came off', before: '—', after: 'tooth strippage' },
      { label: 'Break-in followed', before: '—', after: 'No' },
    ]);
  });

  it('shows money in the record’s currency and a new record’s values only', () => {
    render(
      <RecordHistory
        timeZone="America/Toronto"
        entries={[
          entry({
            entity: 'StockReceipt',
            action: 'create',
            after: { quantity: 12, unitCostMinor: 6140, currency: 'CAD', reference: 'DN-44817', notes: null, id: 'r' },
          }),
        ]}
      />,
    );
    expect(screen.getByText('Recorded')).toBeInTheDocument();
    const lines = screen.getAllByRole('listitem').map((li) => li.textContent);
    expect(lines).toEqual(expect.arrayContaining(['Quantity: 12', 'Cost of one: CA$61.40', 'Reference: DN-44817']));
    expect(lines.some((line) => line?.startsWith('Notes'))).toBe(false);
    expect(screen.getByText('Ines Carvalho')).toBeInTheDocument();
  });
});
