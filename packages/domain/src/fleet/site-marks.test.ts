import { describe, expect, it } from 'vitest';
import { SITE_MARKS, siteMarkSlots } from './site-marks.js';

describe('siteMarkSlots', () => {
  it('gives a site its place in the company list, whoever reads it', () => {
    // The company's sites by code are at places 0–5. A manager sees all; a lead sees places 1, 3 and 4; a site admin place 4.
    expect(siteMarkSlots([0, 1, 2, 3, 4, 5])).toEqual([0, 1, 2, 3, 4, 5]);
    expect(siteMarkSlots([1, 3, 4])).toEqual([1, 3, 4]);
    expect(siteMarkSlots([4])).toEqual([4]);
  });

  it('moves only the later of two sites 32 places apart, to a slot no other of the reader’s sites has', () => {
    // Places 2 and 34 share slot 2; 3 is the next slot, but place 3 is the reader's own, so 34 takes 4.
    expect(siteMarkSlots([2, 3, 34])).toEqual([2, 3, 4]);
    // The moved site never takes the slot of a site later in the list.
    expect(siteMarkSlots([2, 34, 3])).toEqual([2, 4, 3]);
    // Round the end of the marks.
    expect(siteMarkSlots([31, 63, 0])).toEqual([31, 1, 0]);
  });

  it('gives distinct slots to up to 32 sites, and repeats marks only past that', () => {
    const thirtyTwo = Array.from({ length: SITE_MARKS }, (_, i) => i * 7);
    expect(new Set(siteMarkSlots(thirtyTwo)).size).toBe(SITE_MARKS);
    const sixty = Array.from({ length: 60 }, (_, i) => i);
    const slots = siteMarkSlots(sixty);
    expect(slots.slice(0, 32)).toEqual(sixty.slice(0, 32));
    expect(slots[32]).toBe(0);
    expect(slots[59]).toBe(27);
  });
});
