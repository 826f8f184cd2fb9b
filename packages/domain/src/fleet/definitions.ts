/**
 * What each figure of the fleet screens means and where its rule comes from, in words for the screens, the
 * exports and the guide. The figures themselves are the site's own records; the rules that turn records into
 * reliability figures and outlier flags are printed ones, named here.
 */
import { IEC_60050_192 } from '../figures/sources.js';
import { OPERATIONAL_AVAILABILITY_DEFINITION } from '../metrics/reliability.js';

export interface FleetFigureDefinition {
  label: string;
  meaning: string;
  /** The printed source of the rule, or where the figure is read from. */
  source: string;
}

/** NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.17, after Iglewicz & Hoaglin (1993). */
export const MODIFIED_Z_SOURCE =
  'B. Iglewicz and D. C. Hoaglin, How to Detect and Handle Outliers (ASQC, 1993); NIST/SEMATECH e-Handbook of Statistical Methods, §1.3.5.17';

export const FLEET_FIGURE_DEFINITIONS: readonly FleetFigureDefinition[] = [
  {
    label: 'Blades used, blade spend',
    meaning:
      'Blades put on a saw in the period, and what they cost as recorded when each went on, converted to the reporting currency at each month’s rate.',
    source: 'Your sites’ blade records and the rates your administrators entered',
  },
  {
    label: 'Blade life (median), cost per area cut',
    meaning:
      'For blades taken off in the period with the area they cut recorded: the middle value of the area cut per blade, and their cost over their area.',
    source: 'Your sites’ blade records',
  },
  {
    label: 'Operational availability',
    meaning: OPERATIONAL_AVAILABILITY_DEFINITION,
    source: `${IEC_60050_192.citation} (operational availability; mean time between failures; mean time to restoration)`,
  },
  {
    label: 'MTBF',
    meaning:
      'Mean time between failures: hours the saw was up, over the unplanned stops for a blade failure, a mechanical, hydraulic or electrical fault or another cause that started in the period.',
    source: IEC_60050_192.citation,
  },
  {
    label: 'MTTR',
    meaning:
      'Mean time to restoration: hours those failures kept the saw down, waiting for people and parts included, over their number.',
    source: IEC_60050_192.citation,
  },
  {
    label: 'Flagged against its peers',
    meaning:
      'A saw whose figure lies beyond a modified z-score of 3.5 among saws of the same kind cutting mostly the same material, in the costly direction only.',
    source: MODIFIED_Z_SOURCE,
  },
];
