import { describe, expect, it } from 'vitest';
import { SITE_MARKS } from '@kerfline/domain/fleet/site-marks';
import { OKABE_ITO, POINT_SHAPES, siteColour, siteShape } from './palette';

describe('site marks', () => {
  it('draws as many distinct marks as the API gives slots, and no more', () => {
    expect(OKABE_ITO.length * POINT_SHAPES.length).toBe(SITE_MARKS);
    const marks = Array.from({ length: SITE_MARKS }, (_, slot) => `${siteColour(slot)} ${siteShape(slot)}`);
    expect(new Set(marks).size).toBe(SITE_MARKS);
  });
});
