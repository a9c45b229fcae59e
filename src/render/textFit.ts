/**
 * Shortening text to a platform's limit. Lengths are UTF-16 code units (JavaScript's `length`),
 * never fewer than the characters a platform counts, so a fit here fits there too.
 */
export const ELLIPSIS = '…';

/** Cuts at a code-point boundary so that a surrogate pair is never split into invalid text. */
function cutAt(text: string, length: number): string {
  if (length <= 0) return '';
  const code = text.charCodeAt(length - 1);
  const endsInHighSurrogate = code >= 0xd800 && code <= 0xdbff;
  return text.slice(0, endsInHighSurrogate ? length - 1 : length);
}

/** The text itself when it fits, else its start and an ellipsis, `maxLength` at most. */
export function truncateText(text: string, maxLength: number): string {
  if (text.length <= maxLength) return text;
  if (maxLength <= 0) return '';
  return cutAt(text, maxLength - ELLIPSIS.length) + ELLIPSIS;
}

/**
 * Shortens `raw` so that `transform(shortened)` fits `maxLength` (e.g. when escaping lengthens
 * it). The transform must not shorten text.
 */
export function truncateTransformed(raw: string, maxLength: number, transform: (text: string) => string): string {
  const whole = transform(raw);
  if (whole.length <= maxLength) return whole;
  // Largest raw budget whose transformed cut still fits: the fitted length grows with the budget.
  let fits = 0;
  let tooLong = Math.min(raw.length, maxLength) + 1;
  while (tooLong - fits > 1) {
    const middle = Math.floor((fits + tooLong) / 2);
    if (transform(truncateText(raw, middle)).length <= maxLength) fits = middle;
    else tooLong = middle;
  }
  const fitted = transform(truncateText(raw, fits));
  return fitted.length <= maxLength ? fitted : '';
}

/**
 * Body then tail (the footer) within `maxLength`: the tail is kept whole and the body is
 * shortened first. Only when the tail alone is too long is it cut, which our footers never are.
 */
export function fitWithTail(body: string, tail: string, maxLength: number, separator = '\n'): string {
  if (tail.length >= maxLength) return truncateText(tail, maxLength);
  if (body.length === 0) return tail;
  const room = maxLength - tail.length - separator.length;
  if (room <= ELLIPSIS.length) return tail;
  return `${truncateText(body, room)}${separator}${tail}`;
}

/** Non-empty text for platforms that refuse empty strings. */
export function nonEmpty(text: string, fallback: string): string {
  return text.trim().length > 0 ? text : fallback;
}
