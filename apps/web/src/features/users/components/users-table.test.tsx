import { describe, expect, it } from 'vitest';
import { render, screen, within } from '@testing-library/react';
import type { User } from '@kerfline/domain/users/schema';
import { UsersTable } from './users-table';

const person = (overrides: Partial<User>): User => ({
  id: crypto.randomUUID(),
  email: 'someone@example.test',
  name: 'Someone',
  role: 'technician',
  siteId: null,
  regionId: null,
  managedSiteIds: [],
  allSites: false,
  active: true,
  ...overrides,
});

const sites: Record<string, string> = { s1: 'North Yard', s2: 'South Yard' };
const regions: Record<string, string> = { r1: 'Coastal' };

describe('the people table', () => {
  it('says where each person works, by role', () => {
    render(
      <UsersTable
        users={[
          person({ name: 'Tech', role: 'technician', siteId: 's1' }),
          person({ name: 'Lead', role: 'regional_lead', regionId: 'r1' }),
          person({ name: 'Boss', role: 'manager', allSites: true }),
          person({ name: 'Two-site manager', role: 'manager', managedSiteIds: ['s1', 's2'] }),
          person({ name: 'Gone', role: 'technician', siteId: 's2', active: false }),
        ]}
        siteNameOf={(id) => sites[id]}
        regionNameOf={(id) => regions[id]}
      />,
    );
    const row = (name: string) => within(screen.getByRole('rowheader', { name }).closest('tr')!);
    expect(row('Tech').getByText('North Yard')).toBeInTheDocument();
    expect(row('Lead').getByText('Region Coastal')).toBeInTheDocument();
    expect(row('Boss').getByText('Every site')).toBeInTheDocument();
    expect(row('Two-site manager').getByText('North Yard, South Yard')).toBeInTheDocument();
    expect(row('Gone').getByText('Inactive')).toBeInTheDocument();
  });

  it('says so when nobody matches', () => {
    render(<UsersTable users={[]} siteNameOf={() => undefined} regionNameOf={() => undefined} />);
    expect(screen.getByText('Nobody matches this filter.')).toBeInTheDocument();
  });
});
