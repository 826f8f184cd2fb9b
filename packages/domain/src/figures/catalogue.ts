/**
 * Every figure the calculators and the saw page show, with where it comes from: a printed source, a site
 * setting (shipped starting value or the site's own), or the user's own input or record. A test checks that
 * each has one of these, that every setting named exists, and that no wording says "from memory".
 *
 * The rules of thumb the product keeps as guards or preferences, not as figures of their own, are listed apart
 * in `RULES_OF_THUMB`, each with why it stays (common practice, no source).
 */
import type { PrintedSource } from './basis.js';
import {
  AISC_360_B4_2,
  AISC_MANUAL_15_SHAPES,
  ASME_B36_10M,
  FWW_BAND_TENSION,
  IEC_60050_192,
  MH31_BAND_SAW_NOTES,
  NIST_SP_811,
  SHIGLEY_FLAT_BELTS,
  STEEL_MODULUS_SOURCE,
} from './sources.js';
import { MATERIAL_GROUPS } from '../band-speed/schema.js';

export type CatalogueBasis =
  | { kind: 'published'; source: PrintedSource; what: string }
  | { kind: 'site_setting'; settingKey: string; what: string }
  | { kind: 'input'; what: string };

export type FigurePlace =
  | 'calculator:teeth-in-work'
  | 'calculator:band-length'
  | 'calculator:band-speed'
  | 'calculator:stock-area'
  | 'calculator:break-in'
  | 'calculator:check-targets'
  | 'saw-page'
  | 'metrics';

export interface CatalogueFigure {
  id: string;
  label: string;
  shownOn: readonly FigurePlace[];
  /** Every part the figure rests on; all must be published, a site setting or the user's own input. */
  bases: readonly CatalogueBasis[];
}

const setting = (settingKey: string, what: string): CatalogueBasis => ({ kind: 'site_setting', settingKey, what });
const printed = (source: PrintedSource, what: string): CatalogueBasis => ({ kind: 'published', source, what });
const input = (what: string): CatalogueBasis => ({ kind: 'input', what });
const units = printed(NIST_SP_811, 'exact unit factors');

export const FIGURE_CATALOGUE: readonly CatalogueFigure[] = [
  {
    id: 'teeth_in_work',
    label: 'Teeth in the work',
    shownOn: ['calculator:teeth-in-work'],
    bases: [input('stock dimensions and pitch'), units],
  },
  {
    id: 'pitch_for_solids',
    label: 'Pitch for a solid section',
    shownOn: ['calculator:teeth-in-work'],
    bases: [printed(MH31_BAND_SAW_NOTES, 'pitch by length of cut'), input('stock dimensions')],
  },
  {
    id: 'teeth_in_work_guards',
    label: 'Fewest and most teeth in the work, and the preferred range',
    shownOn: ['calculator:teeth-in-work'],
    bases: [setting('teeth_in_work', 'fewest, most and preferred teeth in the work')],
  },
  {
    id: 'metal_under_band',
    label: 'Metal under the band (mean over the cut, at the centre line)',
    shownOn: ['calculator:teeth-in-work'],
    bases: [input('stock dimensions'), printed(MH31_BAND_SAW_NOTES, "a round solid's length of cut is its diameter")],
  },
  {
    id: 'band_length',
    label: 'Band length from the wheels, centre distance for a band',
    shownOn: ['calculator:band-length', 'saw-page'],
    bases: [printed(SHIGLEY_FLAT_BELTS, 'open-belt length'), input('wheel diameters, centre distance')],
  },
  {
    id: 'bending_stress',
    label: 'Bending stress on the wheels',
    shownOn: ['saw-page'],
    bases: [
      printed(STEEL_MODULUS_SOURCE, 'E = 207 GPa'),
      printed(SHIGLEY_FLAT_BELTS, 'σ = E·t/D'),
      input('band thickness, wheel diameter'),
    ],
  },
  {
    id: 'bends_per_hour',
    label: 'Bends per hour at top speed',
    shownOn: ['saw-page'],
    bases: [input('band length, top band speed, two wheels'), units],
  },
  {
    id: 'band_speed_range',
    label: 'Band speed range for a material',
    shownOn: ['calculator:band-speed', 'calculator:break-in'],
    bases: [
      ...MATERIAL_GROUPS.map((g) => setting(`band_speed.${g}`, 'reference range, 4 in, bi-metal, coolant')),
      printed(MH31_BAND_SAW_NOTES, 'changes for length of cut, carbon blade, dry cutting'),
      units,
    ],
  },
  {
    id: 'cut_area_solids_and_pipe',
    label: 'Cut area of bars, angles and round tube',
    shownOn: ['calculator:stock-area'],
    bases: [input('stock dimensions'), printed(ASME_B36_10M, 'pipe areas checked against the printed table')],
  },
  {
    id: 'cut_area_beams_channels',
    label: 'Cut area of W and C sections',
    shownOn: ['calculator:stock-area'],
    bases: [
      printed(AISC_MANUAL_15_SHAPES, 'printed areas, root fillets included'),
      input('section dimensions, root radius'),
    ],
  },
  {
    id: 'cut_area_hss',
    label: 'Cut area of rectangular and square tube',
    shownOn: ['calculator:stock-area'],
    bases: [
      printed(AISC_360_B4_2, 'design wall 0.93 × nominal'),
      printed(AISC_MANUAL_15_SHAPES, 'corner radius 2t'),
      input('tube dimensions'),
    ],
  },
  {
    id: 'break_in_steps',
    label: 'Break-in feed steps',
    shownOn: ['calculator:break-in'],
    bases: [
      setting('break_in', 'starting feed, two steps up, band speed, minutes or area of each step'),
      input('the normal cutting rate, when known'),
    ],
  },
  {
    id: 'guide_opening',
    label: 'Guide opening target and passing range',
    shownOn: ['calculator:check-targets', 'saw-page'],
    bases: [setting('guide_clearance', 'extra clearance and open-side tolerance'), input('band thickness')],
  },
  {
    id: 'tracking_overhang',
    label: 'Tracking overhang',
    shownOn: ['calculator:check-targets', 'saw-page'],
    bases: [setting('tracking', 'least and greatest overhang, tolerance'), input('band width')],
  },
  {
    id: 'head_force',
    label: 'Head down-force by spring balance',
    shownOn: ['calculator:check-targets'],
    bases: [setting('head_force', 'least and greatest force'), input("the saw's head feed")],
  },
  {
    id: 'bearing_wear',
    label: 'Bearing wear gap',
    shownOn: ['calculator:check-targets'],
    bases: [setting('bearing_wear', 'largest gap')],
  },
  {
    id: 'band_tension',
    label: 'Band tension range',
    shownOn: ['calculator:check-targets'],
    bases: [
      setting('band_tension.carbon', 'shipped: published blade makers’ range'),
      setting('band_tension.bimetal', 'shipped: published blade makers’ range'),
      setting('band_tension.carbide_tipped', 'shipped starting value'),
      printed(FWW_BAND_TENSION, 'carbon and bi-metal ranges'),
    ],
  },
  {
    id: 'availability_mtbf_mttr',
    label: 'Operational availability, MTBF, MTTR',
    shownOn: ['metrics'],
    bases: [printed(IEC_60050_192, 'terms'), input('downtime records, shifts')],
  },
];

/**
 * Rules of thumb kept inside a computation (common practice, no source), not shown as figures of their own.
 * Each says where it acts. The teeth-in-work guards and preference were one until they became the site setting
 * `teeth_in_work`; they are listed for the contributor guide.
 */
export const RULES_OF_THUMB: readonly { id: string; rule: string; actsOn: string }[] = [
  {
    id: 'tracking_ratio',
    rule: 'The tooth edge overhangs the wheel face by 1/8 of the band width.',
    actsOn: 'the tracking target, within the site’s tracking setting',
  },
];
