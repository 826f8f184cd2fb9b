import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { ApiError } from '../../../lib/api-client';
import { OTHER_SITE_ID, REGION_ID, SITE_ID } from '../../../test-support/fixtures';
import type { UserCreateParsed } from '../api/mutations';
import { PersonForm } from './person-form';

const THIRD_SITE_ID = '2d4f6a8c-1e3b-4d5f-9a7c-8e6b4d2f0a13';
const sites = [
  { id: SITE_ID, name: 'Holt Bar Works (HLT)' },
  { id: OTHER_SITE_ID, name: 'Marrow Tube Yard (MTY)' },
  { id: THIRD_SITE_ID, name: 'Pike Street Cut Shop (PSC)' },
];
const regions = [{ id: REGION_ID, name: 'Great Lakes' }];

type Submit = (input: UserCreateParsed) => Promise<unknown>;

function renderForm(onSubmit: Submit = vi.fn<Submit>()) {
  render(<PersonForm sites={sites} regions={regions} submitLabel="Add person" onSubmit={onSubmit} />);
  return userEvent.setup();
}

const PASSWORD = 'kerf-and-feed-2026';

async function fillPerson(user: ReturnType<typeof userEvent.setup>, role: RegExp) {
  await user.type(screen.getByRole('textbox', { name: /^Name/ }), 'Rosa Lindqvist');
  await user.type(screen.getByRole('textbox', { name: /^E-mail/ }), 'Rosa.Lindqvist@example.com');
  await user.type(screen.getByLabelText('Password'), PASSWORD);
  await user.click(screen.getByRole('radio', { name: role }));
}

/** Which of the role-dependent controls are on screen. */
function assignmentControls() {
  return {
    homeSite: screen.queryByRole('combobox', { name: 'Home site' }) !== null,
    region: screen.queryByRole('combobox', { name: 'Region' }) !== null,
    siteScope: screen.queryByRole('group', { name: 'Sites they see' }) !== null,
    siteList: screen.queryByRole('group', { name: 'Their sites' }) !== null,
  };
}

describe('PersonForm', () => {
  it('shows only the assignment the chosen role needs', async () => {
    const user = renderForm();
    const none = { homeSite: false, region: false, siteScope: false, siteList: false };
    expect(assignmentControls()).toEqual(none);

    await user.click(screen.getByRole('radio', { name: /Saw technician/ }));
    expect(assignmentControls()).toEqual({ ...none, homeSite: true });
    await user.click(screen.getByRole('radio', { name: /Site admin/ }));
    expect(assignmentControls()).toEqual({ ...none, homeSite: true });
    await user.click(screen.getByRole('radio', { name: /Regional maintenance lead/ }));
    expect(assignmentControls()).toEqual({ ...none, region: true });
    await user.click(screen.getByRole('radio', { name: /Operations manager/ }));
    expect(assignmentControls()).toEqual({ ...none, siteScope: true, siteList: true });
    await user.click(screen.getByRole('radio', { name: /Every site/ }));
    expect(assignmentControls()).toEqual({ ...none, siteScope: true });
    await user.click(screen.getByRole('radio', { name: /Administrator/ }));
    expect(assignmentControls()).toEqual(none);
  });

  it('sends a technician with their home site and nothing else', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await fillPerson(user, /Saw technician/);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Home site' }), OTHER_SITE_ID);
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    expect(onSubmit.mock.calls[0]?.[0]).toEqual({
      name: 'Rosa Lindqvist',
      email: 'rosa.lindqvist@example.com',
      role: 'technician',
      password: PASSWORD,
      siteId: OTHER_SITE_ID,
      regionId: null,
      managedSiteIds: [],
      allSites: false,
    });
  });

  it('sends a manager with the sites ticked, leaving out a home site chosen for another role first', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await fillPerson(user, /Site admin/);
    await user.selectOptions(screen.getByRole('combobox', { name: 'Home site' }), SITE_ID);
    await user.click(screen.getByRole('radio', { name: /Operations manager/ }));
    await user.click(screen.getByRole('checkbox', { name: /Pike Street/ }));
    await user.click(screen.getByRole('checkbox', { name: /Holt Bar Works/ }));
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(onSubmit).toHaveBeenCalledTimes(1);
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({
      role: 'manager',
      siteId: null,
      regionId: null,
      managedSiteIds: [THIRD_SITE_ID, SITE_ID],
      allSites: false,
    });
  });

  it('sends a manager of every site as allSites, and a regional lead with their region', async () => {
    const onSubmit = vi.fn<Submit>().mockResolvedValue(undefined);
    const user = renderForm(onSubmit);
    await fillPerson(user, /Operations manager/);
    await user.click(screen.getByRole('radio', { name: /Every site/ }));
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(onSubmit.mock.calls[0]?.[0]).toMatchObject({ role: 'manager', managedSiteIds: [], allSites: true });

    await user.click(screen.getByRole('radio', { name: /Regional maintenance lead/ }));
    await user.selectOptions(screen.getByRole('combobox', { name: 'Region' }), REGION_ID);
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(onSubmit.mock.calls[1]?.[0]).toMatchObject({
      role: 'regional_lead',
      regionId: REGION_ID,
      siteId: null,
      managedSiteIds: [],
      allSites: false,
    });
  });

  it('asks for the missing assignment and a long enough password in words', async () => {
    const onSubmit = vi.fn<Submit>();
    const user = renderForm(onSubmit);
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(await screen.findByText('Choose a role')).toBeInTheDocument();
    expect(screen.getByRole('group', { name: 'Role' })).toHaveAccessibleDescription('Choose a role');

    await user.click(screen.getByRole('radio', { name: /Operations manager/ }));
    await user.type(screen.getByLabelText('Password'), 'short');
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(await screen.findByText('Tick at least one site, or choose every site')).toBeInTheDocument();
    expect(screen.getByLabelText('Password')).toHaveAccessibleDescription(/must be at least 12 characters/);
    expect(screen.getByRole('textbox', { name: /^E-mail/ })).toHaveAccessibleDescription(/must be an e-mail address/);

    await user.click(screen.getByRole('radio', { name: /Saw technician/ }));
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(await screen.findByText('Choose the site they work at')).toBeInTheDocument();
    expect(onSubmit).not.toHaveBeenCalled();
  });

  it('shows and hides the password on request', async () => {
    const user = renderForm();
    const password = screen.getByLabelText('Password');
    expect(password).toHaveAttribute('type', 'password');
    expect(password).toHaveAttribute('autocomplete', 'new-password');
    await user.click(screen.getByRole('button', { name: 'Show password' }));
    expect(password).toHaveAttribute('type', 'text');
    await user.click(screen.getByRole('button', { name: 'Hide password' }));
    expect(password).toHaveAttribute('type', 'password');
    expect(password).toHaveAccessibleDescription(/ask them to change it/);
  });

  it('shows an e-mail already in use beside the field and above the form', async () => {
    const onSubmit = vi.fn<Submit>().mockRejectedValue(
      new ApiError({
        code: 'CONFLICT',
        status: 409,
        message: 'Someone already uses that e-mail address',
        details: [{ path: 'email', message: 'already taken' }],
      }),
    );
    const user = renderForm(onSubmit);
    await fillPerson(user, /Administrator/);
    await user.click(screen.getByRole('button', { name: 'Add person' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Someone already uses that e-mail address');
    expect(screen.getByRole('textbox', { name: /^E-mail/ })).toHaveAccessibleDescription(/already taken/);
  });
});
