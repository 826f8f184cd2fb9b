import { distance } from 'fastest-levenshtein';
import { IMPORT_FIELDS, IMPORT_KINDS, type ChoiceDefinition, type ImportField, type ImportKind } from './fields.js';
import { normaliseHeader, normaliseWord, unitInHeader } from './values.js';
import { defaultUnit } from './units.js';
import type { ColumnPlan, ImportMemory } from './schema.js';

/**
 * Suggestions for the column mapping: which field each header fills (from the kind's header words in English,
 * German and Spanish, then by closeness of spelling), which unit a numeric column is in, and which existing saw
 * or category a written value means. The user confirms or changes every suggestion.
 */

/** 1 for the same text, falling towards 0 as the spelling differs (Levenshtein distance over the longer length). */
export function similarity(a: string, b: string): number {
  if (a === b) return 1;
  const longest = Math.max(a.length, b.length);
  if (longest === 0) return 1;
  return 1 - distance(a, b) / longest;
}

const words = (text: string) =>
  new Set(
    normaliseWord(text.replace(/&/g, ' and '))
      .split(/[^a-z0-9]+/)
      .filter((w) => w !== ''),
  );

/**
 * How close two names are: the share of words they have in common, or the closeness of their spelling, whichever
 * is higher ("Guide & bearing wear" is nearer "Guide and pressure bearing wear" than "Guide bearing clearance").
 */
export function nameScore(a: string, b: string): number {
  const wa = words(a);
  const wb = words(b);
  const common = [...wa].filter((w) => wb.has(w)).length;
  const union = new Set([...wa, ...wb]).size;
  return Math.max(union === 0 ? 0 : common / union, similarity(looseKey(a), looseKey(b)) * 0.9);
}

/** How well a header names a field: 1 for one of its words, less for containing one, or for a near spelling. */
export function headerScore(header: string, field: ImportField): number {
  const h = normaliseHeader(header);
  if (h === '') return 0;
  const key = normaliseHeader(field.key.replace(/([A-Z])/g, ' $1').replace(/ (Mm|M Per Min|Mpa|Mm2)$/i, ''));
  const words = [normaliseHeader(field.label), key, ...field.synonyms.map(normaliseHeader)];
  let best = 0;
  const tokens = new Set(h.split(' '));
  for (const w of words) {
    if (w === '') continue;
    if (w === h) return 1;
    const wTokens = w.split(' ');
    if (wTokens.length > 1 && wTokens.every((t) => tokens.has(t))) best = Math.max(best, 0.9);
    else if (wTokens.length === 1 && tokens.has(w) && w.length >= 3) best = Math.max(best, 0.75);
    const s = similarity(h, w);
    if (s >= 0.75) best = Math.max(best, s * 0.9);
  }
  return best;
}

/** A suggested field (and unit) for each column, each field used at most once, best matches first. */
export function suggestColumns(
  kind: ImportKind,
  headers: readonly string[],
  system: 'metric' | 'imperial',
  memory: ImportMemory | null = null,
): ColumnPlan[] {
  const fields = IMPORT_FIELDS[kind];
  const plans: ColumnPlan[] = headers.map((header) => ({ header, field: null, unit: null }));
  const taken = new Set<string>();
  // What this site mapped last time, for headers written the same way, comes first.
  if (memory && memory.kind === kind) {
    headers.forEach((header, i) => {
      const remembered = memory.columns[normaliseHeader(header)];
      if (!remembered || taken.has(remembered.field)) return;
      const field = fields.find((x) => x.key === remembered.field);
      if (!field) return;
      taken.add(field.key);
      plans[i] = { header, field: field.key, unit: field.quantity ? (remembered.unit ?? null) : null };
    });
  }
  const candidates: { column: number; field: ImportField; score: number }[] = [];
  headers.forEach((header, column) => {
    if (plans[column]!.field) return;
    for (const field of fields) {
      const score = headerScore(header, field);
      if (score >= 0.7) candidates.push({ column, field, score });
    }
  });
  candidates.sort((a, b) => b.score - a.score || a.column - b.column);
  for (const c of candidates) {
    if (plans[c.column]!.field || taken.has(c.field.key)) continue;
    taken.add(c.field.key);
    plans[c.column] = { header: headers[c.column]!, field: c.field.key, unit: null };
  }
  // Units: the header's own, then the site's system.
  return plans.map((plan) => {
    const field = fields.find((x) => x.key === plan.field);
    if (!field?.quantity) return { ...plan, unit: null };
    return {
      ...plan,
      unit: plan.unit ?? unitInHeader(plan.header, field.quantity) ?? defaultUnit(field.quantity, system),
    };
  });
}

/** How many of a kind's required fields these headers name, for telling the user they chose the wrong kind. */
export function kindFit(kind: ImportKind, headers: readonly string[]): { matched: number; required: number } {
  const required = IMPORT_FIELDS[kind].filter((x) => x.required);
  const matched = required.filter((field) => headers.some((h) => headerScore(h, field) >= 0.75)).length;
  return { matched, required: required.length };
}

/**
 * The kind whose required columns these headers name best, when it is clearly a better fit than the chosen one;
 * null when the chosen kind fits as well as any.
 */
export function betterKind(
  chosen: ImportKind,
  headers: readonly string[],
  available: readonly ImportKind[] = IMPORT_KINDS,
): ImportKind | null {
  const share = (k: ImportKind) => {
    const fit = kindFit(k, headers);
    return fit.required === 0 ? 0 : fit.matched / fit.required;
  };
  const mine = share(chosen);
  if (mine >= 0.5) return null;
  let best: ImportKind | null = null;
  let bestShare = mine;
  for (const k of available) {
    if (k === chosen) continue;
    const s = share(k);
    if (s > bestShare && s >= 0.6) [best, bestShare] = [k, s];
  }
  return best;
}

/** Each choice's words, normalised once: a file of 100 000 rows asks the same question 100 000 times. */
const choiceIndex = new WeakMap<ChoiceDefinition, Map<string, string>>();

/** The value of a choice a written word means, from the choice's own words; null when nothing fits. */
export function suggestChoice(choice: ChoiceDefinition, written: string): string | null {
  let index = choiceIndex.get(choice);
  if (!index) {
    index = new Map();
    for (const value of choice.values) {
      const words = [value, value.replace(/_/g, ' '), choice.labels[value] ?? '', ...(choice.words[value] ?? [])];
      for (const x of words) {
        const key = normaliseWord(x);
        if (key !== '' && !index.has(key)) index.set(key, value);
      }
    }
    choiceIndex.set(choice, index);
  }
  return index.get(normaliseWord(written)) ?? null;
}

export type SawRef = { id: string; assetTag: string; name: string; retired: boolean };
export type SpecRef = { id: string; name: string };

/** Lower case with only letters and digits: "HAM S01", "ham-s01" and "HAM-S01" compare equal. */
export const looseKey = (text: string): string => normaliseWord(text).replace(/[^a-z0-9]/g, '');

/** The saw a written value names: by asset tag, then by name, ignoring case, spaces and punctuation. */
const sawIndex = new WeakMap<readonly SawRef[], Map<string, SawRef | null>>();

/**
 * The saw a written value names: by asset tag, then by name, ignoring case, spaces and punctuation. Names repeat
 * (a retired saw's name is often given to its successor): a name counts only when one saw in service carries it,
 * or, failing that, exactly one saw at all. Answers are kept per list of saws, since a file names few saws often.
 */
export function matchSaw(saws: readonly SawRef[], written: string): SawRef | null {
  const key = looseKey(written);
  if (key === '') return null;
  let index = sawIndex.get(saws);
  if (!index) {
    index = new Map();
    sawIndex.set(saws, index);
  }
  if (index.has(key)) return index.get(key)!;
  let found: SawRef | null = saws.find((s) => looseKey(s.assetTag) === key) ?? null;
  if (!found) {
    const named = saws.filter((s) => looseKey(s.name) === key);
    const active = named.filter((s) => !s.retired);
    found = active.length === 1 ? active[0]! : active.length === 0 && named.length === 1 ? named[0]! : null;
  }
  index.set(key, found);
  return found;
}

/** Saws whose tag or name is spelt close to the written value: at most three, closest first. */
export function nearSaws(saws: readonly SawRef[], written: string): SawRef[] {
  const key = looseKey(written);
  if (key === '') return [];
  const scored = saws
    .map((s) => ({ s, score: Math.max(similarity(key, looseKey(s.assetTag)), similarity(key, looseKey(s.name))) }))
    .filter((x) => x.score >= 0.6)
    .sort((a, b) => b.score - a.score);
  return scored.slice(0, 3).map((x) => x.s);
}

/** The spec a written value names (exact, ignoring case, spaces and punctuation). */
const specIndex = new WeakMap<readonly SpecRef[], Map<string, SpecRef>>();

export function matchSpec(specs: readonly SpecRef[], written: string): SpecRef | null {
  const key = looseKey(written);
  if (key === '') return null;
  let index = specIndex.get(specs);
  if (!index) {
    index = new Map();
    for (const s of specs) if (!index.has(looseKey(s.name))) index.set(looseKey(s.name), s);
    specIndex.set(specs, index);
  }
  return index.get(key) ?? null;
}

export function nearSpecs(specs: readonly SpecRef[], written: string): SpecRef[] {
  const key = looseKey(written);
  if (key === '') return [];
  return specs
    .map((s) => ({ s, score: nameScore(written, s.name) }))
    .filter((x) => x.score >= 0.6)
    .sort((a, b) => b.score - a.score)
    .slice(0, 3)
    .map((x) => x.s);
}
