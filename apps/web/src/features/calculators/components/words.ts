/**
 * "a" or "an" before a figure, by how it is said: an 8 mm wall, an 11 in bar, an 18,000 mm band, but a 1,100 mm
 * band and a 110 mm bar.
 */
export function articleFor(figureText: string): 'a' | 'an' {
  return /^8/.test(figureText) || /^1[18](?!\d)/.test(figureText) ? 'an' : 'a';
}

/** The same text with its first letter in capitals, to open a sentence. */
export function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
