import { describe, expect, it, vi } from 'vitest';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ColumnPlan } from '@kerfline/domain/imports/schema';
import { ColumnsStep } from './columns-step';
import { bothReadings, mappingProblems } from './plan-helpers';

const scan = {
  opened: {
    format: 'csv' as const,
    encoding: 'utf-8' as const,
    delimiter: ';' as const,
    sheet: null,
    sheets: null,
    header: ['Machine', 'On', 'Area (cm2)'],
    rowsTotal: 2,
    notes: [],
  },
  sample: [['RTM-S01', '03/01/2022 07:00', '9120']],
  distinct: [['RTM-S01'], ['03/01/2022 07:00', '02/02/2022 15:30'], ['9120']],
};

function renderStep(columns: ColumnPlan[], onColumns = vi.fn(), onDateOrder = vi.fn()) {
  render(
    <ColumnsStep
      kind="blade_runs"
      scan={scan}
      columns={columns}
      onColumns={onColumns}
      unitSystem="metric"
      decimalMark="."
      onDecimalMark={() => {}}
      dateGuess={{ kind: 'ambiguous', example: '03/01/2022 07:00', lean: null }}
      dateOrder={null}
      onDateOrder={onDateOrder}
      rememberedBy={null}
    />,
  );
  return userEvent.setup();
}

describe('matching the columns', () => {
  const columns: ColumnPlan[] = [
    { header: 'Machine', field: 'saw', unit: null },
    { header: 'On', field: 'installedAt', unit: null },
    { header: 'Area (cm2)', field: 'areaCutMm2', unit: 'cm2' },
  ];

  it('asks how an ambiguous date is written, showing it read both ways', async () => {
    const onDateOrder = vi.fn();
    const user = renderStep(columns, vi.fn(), onDateOrder);
    expect(screen.getByText('How is “03/01/2022 07:00” written?')).toBeInTheDocument();
    await user.click(screen.getByLabelText(/^March 1, 2022/));
    expect(onDateOrder).toHaveBeenCalledWith('mdy');
    expect(screen.getByLabelText(/^3 January 2022/)).toBeInTheDocument();
  });

  it('gives a field to one column only, and a unit to numeric ones', async () => {
    const onColumns = vi.fn();
    const user = renderStep(columns, onColumns);
    expect(screen.getByLabelText('Unit of column Area (cm2)')).toHaveValue('cm2');
    await user.selectOptions(screen.getByLabelText('Kerfline field for column Area (cm2)'), 'saw');
    expect(onColumns).toHaveBeenCalledWith([
      { header: 'Machine', field: null, unit: null },
      { header: 'On', field: 'installedAt', unit: null },
      { header: 'Area (cm2)', field: 'saw', unit: null },
    ]);
  });

  it('lists what is missing before the rows can be checked', () => {
    expect(mappingProblems('blade_runs', columns, null, true)).toEqual([
      'No column is matched to Blade spec, which every row needs',
      'Say how the dates are written (the question above)',
    ]);
    expect(bothReadings('03/04/23')).toEqual({ dmy: '3 April 2023', mdy: 'March 4, 2023' });
  });
});
