import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import type { Role } from '@kerfline/domain/users/schema';
import type { Saw } from '@kerfline/domain/saws/schema';
import { StaticAbilityProvider } from '../../../lib/ability';
import { OTHER_SITE_ID, SITE_ID, abilityFor, makeSaw } from '../../../test-support/fixtures';
import { SawsTable } from './saws-table';

const saws: Saw[] = [
  makeSaw(),
  makeSaw({
    id: 'd5f9b2c3-8e4a-4fab-87d6-1a2b3c4d5e66',
    assetTag: 'VS-02',
    name: 'Plate contour saw',
    kind: 'vertical',
    status: 'down',
  }),
];

function renderTable(role: Role, userSiteId: string = SITE_ID) {
  return render(
    <MemoryRouter>
      <StaticAbilityProvider ability={abilityFor(role, userSiteId)}>
        <SawsTable
          heading="Saws"
          saws={saws}
          unitSystemOf={() => 'imperial'}
          addForSiteId={SITE_ID}
          emptyMessage="None"
        />
      </StaticAbilityProvider>
    </MemoryRouter>,
  );
}

describe('SawsTable', () => {
  it("hides 'Add saw' from a technician, who may only read the site's saws", () => {
    renderTable('technician');
    expect(screen.getByRole('link', { name: 'HS-07' })).toBeInTheDocument();
    expect(screen.queryByRole('link', { name: 'Add saw' })).not.toBeInTheDocument();
  });

  it("shows 'Add saw' to the site's own admin, pointing at the new-saw form for that site", () => {
    renderTable('site_admin');
    expect(screen.getByRole('link', { name: 'Add saw' })).toHaveAttribute('href', `/saws/new?siteId=${SITE_ID}`);
  });

  it("hides 'Add saw' from the admin of another site", () => {
    renderTable('site_admin', OTHER_SITE_ID);
    expect(screen.queryByRole('link', { name: 'Add saw' })).not.toBeInTheDocument();
  });

  it('shows band sizes and speeds in the site units, and status in words', () => {
    renderTable('technician');
    const row = screen.getByRole('link', { name: 'HS-07' }).closest('tr')!;
    // 31.75 × 1.0668 × 4114.8 mm = 1.25 × 0.042 × 162 in; 24.384–121.92 m/min = 80–400 ft/min (1 in = 25.4 mm, 1 ft = 0.3048 m, NIST SP 811 B.8).
    expect(within(row).getByText(/1\.25 × 0\.042 × 162\s+in/)).toBeInTheDocument();
    expect(within(row).getByText(/80–400\s+ft\/min/)).toBeInTheDocument();
    expect(within(row).getByText('In service')).toBeInTheDocument();
  });

  it('sorts by status when its header is pressed', async () => {
    renderTable('technician');
    const user = userEvent.setup();
    const tags = () =>
      screen
        .getAllByRole('row')
        .slice(1)
        .map((row) => within(row).getAllByRole('link')[0]?.textContent);
    await user.click(screen.getByRole('button', { name: /Status/ }));
    expect(tags()).toEqual(['HS-07', 'VS-02']);
    await user.click(screen.getByRole('button', { name: /Status/ }));
    expect(tags()).toEqual(['VS-02', 'HS-07']);
    expect(screen.getByRole('columnheader', { name: /Status/ })).toHaveAttribute('aria-sort', 'descending');
  });
});
