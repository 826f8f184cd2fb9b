import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { CalculatorSlug } from './catalogue';
import { calculatorHref } from './calculator-nav';
import { entryText, type Quantity } from './quantities';
import type { CalculatorSaw } from './saw-picker';

/** A head-force limit that applies: the saw's own, on a head fed by gravity or a spring. */
function headForce(saw: CalculatorSaw, newtons: number | null | undefined): number | undefined {
  return saw.headFeed === 'gravity_spring' && newtons !== null && newtons !== undefined ? newtons : undefined;
}

/**
 * A saw's figures under the names the calculators' fields share, each with its quantity: a calculator opened
 * with them starts from that saw. A calculator takes the names it has fields for and ignores the rest.
 */
const SAW_FIGURES: readonly { name: string; quantity: Quantity; of: (saw: CalculatorSaw) => number | undefined }[] = [
  { name: 'thickness', quantity: 'length', of: (saw) => saw.bandThicknessMm },
  { name: 'width', quantity: 'length', of: (saw) => saw.bandWidthMm },
  { name: 'wheel', quantity: 'length', of: (saw) => saw.wheelDiameterMm },
  { name: 'sawMin', quantity: 'bandSpeed', of: (saw) => saw.bandSpeedMinMPerMin },
  { name: 'sawMax', quantity: 'bandSpeed', of: (saw) => saw.bandSpeedMaxMPerMin },
  // A gravity- or spring-fed head's own limits; without them the calculator reads the site's setting.
  { name: 'maxForce', quantity: 'force', of: (saw) => headForce(saw, saw.maxHeadForceN) },
  { name: 'minForce', quantity: 'force', of: (saw) => headForce(saw, saw.minHeadForceN) },
];

/** A saw's figures as a calculator's starting texts, in `system`'s units (plain digits, as a person types). */
export function sawStartTexts(saw: CalculatorSaw, system: UnitSystem): Record<string, string> {
  const texts: Record<string, string> = {};
  for (const figure of SAW_FIGURES) {
    const value = figure.of(saw);
    if (value === undefined) continue;
    // Records are SI floats (0.035 in is 0.8890000000000001 mm): 0.0001 mm is far below any saw's tolerance.
    const metricText = String(Number(value.toFixed(4)));
    texts[figure.name] = entryText({ text: metricText, system: 'metric' }, figure.quantity, system);
  }
  return texts;
}

/**
 * The address of a calculator opened for one saw: its id (so the calculator uses that saw's site settings and
 * units) and its figures in the site's units, so the page shows the answer for that saw straight away.
 */
export function calculatorHrefForSaw(slug: CalculatorSlug, saw: CalculatorSaw, system: UnitSystem): string {
  return calculatorHref(slug, system, { sawId: saw.id, ...sawStartTexts(saw, system) });
}

/** The starting texts in a calculator's address: every parameter but the units and the saw. */
export function startTextsFromSearch(search: URLSearchParams): Record<string, string> {
  const texts: Record<string, string> = {};
  for (const [name, value] of search) if (name !== 'units' && name !== 'sawId') texts[name] = value;
  return texts;
}
