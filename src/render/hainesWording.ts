/** How every message names the Haines Index: by what it measures, never as stability. */
export const HAINES_LABEL = 'dryness-and-lapse-rate index, not a stability measure';

/** "Haines Index 5 (high variant; a dryness-and-lapse-rate index, not a stability measure)". */
export function describeHaines(total: number, variant: 'low' | 'mid' | 'high'): string {
  return `Haines Index ${total} (${variant} variant; a ${HAINES_LABEL})`;
}

/** "6 (high variant; a dryness-and-lapse-rate index, not a stability measure)", for a labelled field. */
export function hainesValueText(total: number, variant: 'low' | 'mid' | 'high'): string {
  return `${total} (${variant} variant; a ${HAINES_LABEL})`;
}
