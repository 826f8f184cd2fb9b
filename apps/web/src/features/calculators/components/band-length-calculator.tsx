import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatLength } from '../../../lib/format';
import { Notice } from '../../../lib/ui/notice';
import {
  CORRECT_THE_FIGURES,
  CalculatorLayout,
  Explanation,
  ResultFigure,
  SourceNote,
  WaitingForInput,
} from './calculator-layout';
import { EntryField, FieldGroup, ModeChoice } from './entry-field';
import { figure } from './quantities';
import {
  BAND_LENGTH_LABELS,
  bandLengthMode,
  evaluateBandLength,
  type BandLengthKey,
  type BandLengthResult,
} from './band-length-values';
import { useEntries } from './use-entries';
import { articleFor, capitalise } from './words';

const MODES = [
  { value: 'length', label: 'Band length', hint: 'The band two wheels take at a centre distance.' },
  { value: 'centre', label: 'Centre distance', hint: 'Where to set the wheels to fit a band.' },
] as const;

/** The wheels as entered, in words; figures echoed from the user's entries drop trailing zeros. */
function wheelsText(result: BandLengthResult, system: UnitSystem): string {
  const drive = formatLength(result.driveMm, system);
  if (result.driveMm === result.idlerMm) return `two ${drive} wheels`;
  const idler = formatLength(result.idlerMm, system);
  return `${articleFor(drive)} ${drive} drive wheel and ${articleFor(idler)} ${idler} idler wheel`;
}

/** Band length from the wheels and centre distance, or the centre distance that fits a band. */
export function BandLengthCalculator({ system }: { system: UnitSystem }) {
  const form = useEntries<BandLengthKey>(system, {
    mode: 'length',
    driveMm: '',
    idlerMm: '',
    centreMm: '',
    bandMm: '',
  });
  const mode = bandLengthMode(form.entries.mode);
  const { errors, formError, result } = evaluateBandLength(form.entries, system);

  const fields = (
    <>
      <ModeChoice legend="Work out" field={form.bind('mode', null, errors)} options={MODES} />
      <FieldGroup legend="Wheels">
        <EntryField
          label={BAND_LENGTH_LABELS.driveMm}
          hint="Where the band runs: over the tyre."
          field={form.bind('driveMm', 'length', errors)}
        />
        <EntryField
          label={BAND_LENGTH_LABELS.idlerMm}
          hint="Leave empty when both wheels are the same size."
          field={form.bind('idlerMm', 'length', errors)}
        />
        {mode === 'length' ? (
          <EntryField
            label={BAND_LENGTH_LABELS.centreMm}
            hint="Between the wheel centres, at working tension."
            field={form.bind('centreMm', 'length', errors)}
            className="sm:col-span-2"
          />
        ) : (
          <EntryField
            label={BAND_LENGTH_LABELS.bandMm}
            hint="Round the loop, as welded."
            field={form.bind('bandMm', 'length', errors)}
            className="sm:col-span-2"
          />
        )}
      </FieldGroup>
    </>
  );

  let body;
  if (result) {
    const band = figure('length', result.bandMm, system);
    const centre = figure('length', result.centreMm, system);
    // The figure worked out is printed at the usual decimals; the one typed in is echoed as typed.
    const typedCentre = formatLength(result.centreMm, system);
    const typedBand = formatLength(result.bandMm, system);
    const wheels = wheelsText(result, system);
    body =
      result.mode === 'length' ? (
        <>
          <ResultFigure label="Band length" value={band.number} unit={band.unit} />
          <Explanation>
            {capitalise(wheels)} {typedCentre} apart take a band {band.text} long.
          </Explanation>
        </>
      ) : (
        <>
          <ResultFigure label="Centre distance" value={centre.number} unit={centre.unit} />
          <Explanation>
            {capitalise(articleFor(typedBand))} {typedBand} band fits {wheels} set {centre.text} apart, centre to
            centre.
          </Explanation>
        </>
      );
  } else if (formError) {
    body = <Notice title="These wheels cannot be worked out">{formError}</Notice>;
  } else {
    const needed = [form.entries.driveMm, mode === 'length' ? form.entries.centreMm : form.entries.bandMm];
    body = (
      <WaitingForInput>
        {needed.every((entry) => entry.text.trim() !== '')
          ? CORRECT_THE_FIGURES
          : mode === 'length'
            ? 'Enter the wheel diameters and the centre distance to see the band length.'
            : 'Enter the wheel diameters and the band length to see where to set the wheels.'}
      </WaitingForInput>
    );
  }

  return (
    <CalculatorLayout
      title="Band length"
      intro="The band a pair of wheels takes, or the centre distance that fits a band you have."
      caution
      form={fields}
      result={
        <>
          {body}
          <SourceNote>
            Open-belt length formula, L = 2C + π(D1 + D2)/2 + (D1 − D2)²/(4C): exact for equal wheels (2C + πD), and
            short of the exact geometry by about (D1 − D2)⁴/(192·C³) for unequal ones, far below a millimetre on a saw.
            {mode === 'centre' ? ' The centre distance is the formula solved for C (its larger root).' : ''} The band’s
            own thickness adds π·t, within the tolerance a band is welded to, and is left out.
          </SourceNote>
        </>
      }
      onSubmit={form.submit}
    />
  );
}
