import { describe, expect, it, vi } from 'vitest';
import { render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { QueryClientProvider } from '@tanstack/react-query';
import { rankLikelyCauses } from '@kerfline/domain/diagnosis/likely-causes';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi } from '../../../test-support/fake-api';
import { RUN_ID, makeRun } from '../../../test-support/records';
import { BladeOffForm } from './blade-off-form';
import { photoProblem } from './blade-off-values';

const diagnosis = {
  ...rankLikelyCauses('tooth_strippage', { breakInDone: false }),
  runId: RUN_ID,
  confirmedCause: null,
  evidenceUsed: { cutLogs: 0, checks: 0, breakInFollowed: false },
};

function renderForm(onDone = vi.fn()) {
  const fake = installFakeApi({
    [`GET /api/blade-runs/${RUN_ID}/likely-causes`]: (request) => ({
      status: 200,
      body: { ...diagnosis, mode: request.query.get('reason') },
    }),
    [`POST /api/blade-runs/${RUN_ID}/remove`]: (request) => ({
      status: 200,
      body: makeRun({
        removedAt: new Date().toISOString(),
        removalReason: (request.body as { reason: 'tooth_strippage' }).reason,
      }),
    }),
    [`POST /api/blade-runs/${RUN_ID}/confirmed-cause`]: (request) => ({
      status: 200,
      body: makeRun({
        removedAt: new Date().toISOString(),
        removalReason: 'tooth_strippage',
        confirmedCause: (request.body as { cause: 'break_in_skipped' }).cause,
      }),
    }),
  });
  render(
    <QueryClientProvider client={createQueryClient()}>
      <BladeOffForm
        run={{ id: RUN_ID, installedAt: '2026-03-01T13:00:00.000Z', bladeSpecName: '1.25 in bi-metal 4/6' }}
        system="imperial"
        timeZone="America/Chicago"
        onDone={onDone}
        cancel={null}
      />
    </QueryClientProvider>,
  );
  return { user: userEvent.setup(), onDone, ...fake };
}

describe('taking a blade off', () => {
  it('shows the safety caution before the work: lock out, gloves and eyes, the band’s stored energy, and who comes first', () => {
    renderForm();
    const caution = screen.getByRole('region', { name: 'Caution: work on the saw safely' });
    expect(caution).toHaveTextContent('Isolate and lock out the power before reaching into the saw.');
    expect(caution).toHaveTextContent('Wear gloves and eye protection');
    expect(caution).toHaveTextContent('A coiled or broken band stores energy and can spring.');
    expect(caution).toHaveTextContent('Put the guards back before running the saw.');
    expect(caution).toHaveTextContent(
      'Your employer’s procedures, local regulations (such as lockout/tagout rules) and the saw maker’s manual come first.',
    );
    // The warning triangle is drawn beside the words, and the caution comes before the button that records the work.
    expect(caution.querySelector('svg path')).toHaveAttribute('fill', '#F6C64A');
    const submit = screen.getByRole('button', { name: 'Take blade off' });
    expect(caution.compareDocumentPosition(submit) & Node.DOCUMENT_POSITION_FOLLOWING).toBeTruthy();
  });

  it('asks why before anything is sent', async () => {
    const { user, requests, onDone } = renderForm();
    await user.click(screen.getByRole('button', { name: 'Take blade off' }));
    expect(await screen.findByText('Choose why the blade came off')).toBeInTheDocument();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);
    expect(onDone).not.toHaveBeenCalled();
  });

  it('shows the saw’s ranked likely causes as soon as a failure reason is chosen, with what moved them', async () => {
    const { user, requests } = renderForm();
    await user.click(screen.getByRole('radio', { name: /Tooth strippage/ }));
    const causes = await screen.findByRole('group', { name: /Likely causes of tooth strippage, most likely first/ });
    const choices = within(causes).getAllByRole('radio');
    // Every cause the ranking gives, then "not sure yet".
    expect(choices).toHaveLength(diagnosis.causes.length + 1);
    expect(within(causes).getByText('Break-in was not done on this blade.')).toBeInTheDocument();
    expect(causes).toHaveTextContent('Ranked by Kerfline from the failure and this saw’s records');
    expect(requests.find((r) => r.path.endsWith('/likely-causes'))?.query.get('reason')).toBe('tooth_strippage');
  });

  it('records the blade as off with its area in mm², then the confirmed cause, and hands back the run', async () => {
    const { user, requests, onDone } = renderForm();
    await user.click(screen.getByRole('radio', { name: /Tooth strippage/ }));
    const causes = await screen.findByRole('group', { name: /Likely causes/ });
    await user.click(within(causes).getByRole('radio', { name: /Break-in skipped/ }));
    await user.type(screen.getByRole('textbox', { name: /Area cut/ }), '1,250');
    await user.type(screen.getByRole('textbox', { name: /Number of cuts/ }), '212');
    await user.click(screen.getByRole('button', { name: 'Take blade off' }));
    await waitFor(() => expect(onDone).toHaveBeenCalledTimes(1));
    const posts = requests.filter((r) => r.method === 'POST');
    expect(posts.map((r) => r.path)).toEqual([
      `/api/blade-runs/${RUN_ID}/remove`,
      `/api/blade-runs/${RUN_ID}/confirmed-cause`,
    ]);
    // 1,250 in² × 645.16 mm²/in² (exact) = 806,450 mm².
    expect(posts[0]!.body).toMatchObject({ reason: 'tooth_strippage', areaCutMm2: 806450, cuts: 212 });
    expect(posts[1]!.body).toEqual({ cause: 'break_in_skipped' });
    expect(onDone.mock.calls[0]![0]).toMatchObject({ confirmedCause: 'break_in_skipped' });
  });

  it('refuses a file that is not a photo or is too large, in words, before sending it', () => {
    expect(photoProblem({ name: 'notes.pdf', size: 1000, type: 'application/pdf' })).toBe(
      'notes.pdf is not a JPEG, PNG or WebP photo.',
    );
    expect(photoProblem({ name: 'big.jpg', size: 11 * 1024 * 1024, type: 'image/jpeg' })).toBe(
      'big.jpg is larger than 10 MB; choose a smaller one.',
    );
    expect(photoProblem({ name: 'band.webp', size: 300_000, type: 'image/webp' })).toBeNull();
  });
});
