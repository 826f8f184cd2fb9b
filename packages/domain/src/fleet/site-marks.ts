/**
 * How many sites the charts can tell apart by their mark: eight colours, each with four point shapes (the web
 * palette, `apps/web/src/lib/palette.ts`, draws slot n with colour n mod 8 and a shape that steps on with it).
 */
export const SITE_MARKS = 32;

/**
 * The mark slot of each of a reader's sites, given each site's place in the company's list of sites in the order
 * they were added (so a new site never changes another's mark), in the reader's order. A site's slot is its place,
 * modulo the marks there are, so a manager, a regional lead and the site's own people see the same site with the
 * same mark and can speak of it by its colour. Where two of the
 * reader's sites would share a slot (their places 32 apart), the first keeps it and the later one takes the next
 * slot that none of the reader's sites has of its own, so every other site keeps its mark; a reader with more sites
 * than marks sees some marks twice, as any palette would.
 */
export function siteMarkSlots(places: readonly number[]): number[] {
  const own = places.map((place) => place % SITE_MARKS);
  if (places.length > SITE_MARKS) return own;
  const taken = new Set<number>();
  const slots = own.map((slot) => {
    if (taken.has(slot)) return null;
    taken.add(slot);
    return slot;
  });
  return slots.map((slot, i) => {
    if (slot !== null) return slot;
    let next = own[i]!;
    while (taken.has(next)) next = (next + 1) % SITE_MARKS;
    taken.add(next);
    return next;
  });
}
