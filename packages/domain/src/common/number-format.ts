/**
 * One Intl.NumberFormat per locale and options, kept for the life of the page or process: making a formatter
 * costs far more than formatting with one, and a fleet screen formats thousands of figures.
 */
const formats = new Map<string, Intl.NumberFormat>();

export function numberFormat(locale: string, options: Intl.NumberFormatOptions): Intl.NumberFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let format = formats.get(key);
  if (!format) {
    format = new Intl.NumberFormat(locale, options);
    formats.set(key, format);
  }
  return format;
}
