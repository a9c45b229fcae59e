import { z } from 'zod';
import { parseCoordinates } from './parseCoordinates.ts';

/**
 * The command language, one verb and its arguments. The bare form (no verb) is a lookup. Each verb
 * has a zod schema over its argument text, so every mistake comes back as one line saying what was
 * wrong, with a correct example.
 */
export type PlaceRef = { kind: 'point'; latitudeDeg: number; longitudeDeg: number } | { kind: 'name'; name: string };

export type Command =
  | { verb: 'lookup'; place: PlaceRef }
  | { verb: 'detail'; place: PlaceRef; localHour: number | null; dayOffset: 0 | 1 }
  | { verb: 'save'; name: string; latitudeDeg: number; longitudeDeg: number }
  | { verb: 'places' }
  | { verb: 'forget'; name: string }
  | { verb: 'watch'; place: PlaceRef }
  | { verb: 'unwatch'; place: PlaceRef }
  | { verb: 'watching' }
  | { verb: 'rules' }
  | { verb: 'threshold'; ruleId: string; value: number | 'default' }
  | { verb: 'mute'; ruleId: string; place: PlaceRef }
  | { verb: 'unmute'; ruleId: string; place: PlaceRef | null }
  | { verb: 'morning'; localTime: string | null }
  | { verb: 'units'; unitSystem: 'metric' | 'us' }
  | { verb: 'help' };

export type Verb = Command['verb'];

/** One example per command, shown by help and in every error about that command. */
export const COMMAND_EXAMPLES: Record<Verb, { usage: string; example: string; what: string }> = {
  lookup: { usage: 'PLACE | LAT,LON', example: '44.8N 115.4W', what: 'the next 48 hours: when mixing reaches dry air aloft, and more' },
  detail: { usage: 'detail PLACE|LAT,LON [HH] [tomorrow]', example: 'detail Cinder Ridge 15', what: 'one hour: layer table and skew-T diagram' },
  save: { usage: 'save NAME LAT,LON', example: 'save Cinder Ridge 44.81,-115.43', what: 'save a named place for this channel' },
  places: { usage: 'places', example: 'places', what: "list this channel's saved places" },
  forget: { usage: 'forget NAME', example: 'forget Cinder Ridge', what: 'remove a saved place' },
  watch: { usage: 'watch PLACE|LAT,LON', example: 'watch Cinder Ridge', what: 'alerts on for a place in this channel' },
  unwatch: { usage: 'unwatch PLACE|LAT,LON', example: 'unwatch Cinder Ridge', what: 'alerts off for a place' },
  watching: { usage: 'watching', example: 'watching', what: 'what this channel watches' },
  rules: { usage: 'rules', example: 'rules', what: "alert rules and this channel's thresholds" },
  threshold: { usage: 'threshold RULE VALUE|default', example: 'threshold hdw-above 300', what: "change a rule's threshold for this channel" },
  mute: { usage: 'mute RULE PLACE|LAT,LON', example: 'mute hdw-above Cinder Ridge', what: "hold a rule's alerts at a place for 6 hours" },
  unmute: { usage: 'unmute RULE [PLACE|LAT,LON]', example: 'unmute hdw-above Cinder Ridge', what: 'end a mute early (without a place: everywhere)' },
  morning: { usage: 'morning HH:MM|off', example: 'morning 06:30', what: 'morning summary time (local to each place)' },
  units: { usage: 'units us|metric', example: 'units us', what: 'units for this channel' },
  help: { usage: 'help', example: 'help', what: 'this list' },
};

const VERBS = Object.keys(COMMAND_EXAMPLES).filter((verb) => verb !== 'lookup') as Exclude<Verb, 'lookup'>[];

const placeName = z
  .string()
  .trim()
  .min(1, 'a place name is needed')
  .max(60, 'a place name can be at most 60 characters')
  .regex(/^[\p{L}\p{N}][\p{L}\p{N} .'’()\-/#]*$/u, 'a place name uses letters, digits, spaces and . \' - ( ) / #');

/** A point or a saved place's name. */
const placeRef = z.string().transform((text, context): PlaceRef => {
  const trimmed = text.trim();
  if (trimmed.length === 0) {
    context.addIssue({ code: 'custom', message: 'a place name or LAT,LON is needed' });
    return z.NEVER;
  }
  const point = parseCoordinates(trimmed);
  if (point.kind === 'point') return { kind: 'point', latitudeDeg: point.latitudeDeg, longitudeDeg: point.longitudeDeg };
  if (point.kind === 'invalid') {
    context.addIssue({ code: 'custom', message: point.reason });
    return z.NEVER;
  }
  const name = placeName.safeParse(trimmed);
  if (!name.success) {
    context.addIssue({ code: 'custom', message: name.error.issues[0].message });
    return z.NEVER;
  }
  return { kind: 'name', name: name.data };
});

const noArguments = z.string().trim().max(0, 'takes nothing after it');

const saveArguments = z.string().transform((text, context) => {
  const words = text.trim().split(/\s+/).filter(Boolean);
  // The point is at the end: try the last one, two, three or four words (e.g. "44.8 N, 115.4 W").
  for (let take = Math.min(4, words.length - 1); take >= 1; take--) {
    const point = parseCoordinates(words.slice(-take).join(' '));
    if (point.kind === 'point') {
      const name = placeName.safeParse(words.slice(0, -take).join(' '));
      if (!name.success) {
        context.addIssue({ code: 'custom', message: name.error.issues[0].message });
        return z.NEVER;
      }
      return { name: name.data, latitudeDeg: point.latitudeDeg, longitudeDeg: point.longitudeDeg };
    }
    if (point.kind === 'invalid') {
      context.addIssue({ code: 'custom', message: point.reason });
      return z.NEVER;
    }
  }
  context.addIssue({ code: 'custom', message: 'a name and then a point (LAT,LON) are needed' });
  return z.NEVER;
});

const detailArguments = z.string().transform((text, context) => {
  const words = text.trim().split(/\s+/).filter(Boolean);
  let dayOffset: 0 | 1 = 0;
  let localHour: number | null = null;
  const last = () => words[words.length - 1]?.toLowerCase();
  if (last() === 'tomorrow' || last() === 'today') dayOffset = words.pop()!.toLowerCase() === 'tomorrow' ? 1 : 0;
  const hourMatch = /^(\d{1,2})(?::00)?h?$/.exec(last() ?? '');
  if (hourMatch && words.length > 1) {
    localHour = Number(hourMatch[1]);
    words.pop();
    if (localHour > 23) {
      context.addIssue({ code: 'custom', message: `hour ${localHour} is not 0–23` });
      return z.NEVER;
    }
  }
  const place = placeRef.safeParse(words.join(' '));
  if (!place.success) {
    context.addIssue({ code: 'custom', message: place.error.issues[0].message });
    return z.NEVER;
  }
  return { place: place.data, localHour, dayOffset };
});

const thresholdArguments = z.string().transform((text, context) => {
  const [ruleId, rawValue, ...rest] = text.trim().split(/\s+/).filter(Boolean);
  if (!ruleId || rawValue === undefined || rest.length > 0) {
    context.addIssue({ code: 'custom', message: 'a rule id and one value (or "default") are needed' });
    return z.NEVER;
  }
  if (!ruleIdWord(ruleId, context)) return z.NEVER;
  if (rawValue.toLowerCase() === 'default') return { ruleId, value: 'default' as const };
  const value = Number(rawValue);
  if (!Number.isFinite(value)) {
    context.addIssue({ code: 'custom', message: `"${rawValue}" is not a number` });
    return z.NEVER;
  }
  return { ruleId, value };
});

/** A rule id as typed: lower-case letters, digits and hyphens (the shipped ids are of this form). */
function ruleIdWord(word: string, context: z.RefinementCtx): boolean {
  if (/^[a-z0-9-]{2,60}$/.test(word)) return true;
  context.addIssue({ code: 'custom', message: `"${word}" is not a rule id (see "rules")` });
  return false;
}

/** A rule id, then a place or none; null (with the issue added) when the text is not that. */
function ruleThenPlace(text: string, context: z.RefinementCtx, missingRule: string): { ruleId: string; place: PlaceRef | null } | null {
  const [ruleId, ...placeWords] = text.trim().split(/\s+/).filter(Boolean);
  if (!ruleId) {
    context.addIssue({ code: 'custom', message: missingRule });
    return null;
  }
  if (!ruleIdWord(ruleId, context)) return null;
  if (placeWords.length === 0) return { ruleId, place: null };
  const place = placeRef.safeParse(placeWords.join(' '));
  if (!place.success) {
    context.addIssue({ code: 'custom', message: place.error.issues[0].message });
    return null;
  }
  return { ruleId, place: place.data };
}

/** A mute holds at one place, so the place is required. */
const muteArguments = z.string().transform((text, context) => {
  const parsed = ruleThenPlace(text, context, 'a rule id is needed, then a place');
  if (!parsed) return z.NEVER;
  if (!parsed.place) {
    context.addIssue({ code: 'custom', message: `a place is needed after "${parsed.ruleId}": a mute holds at one place` });
    return z.NEVER;
  }
  return { ruleId: parsed.ruleId, place: parsed.place };
});

/** Without a place, the rule's mutes end everywhere in the channel. */
const unmuteArguments = z.string().transform((text, context) => ruleThenPlace(text, context, 'a rule id is needed, then a place (or none for everywhere)') ?? z.NEVER);

const morningArguments = z
  .string()
  .trim()
  .transform((text, context) => {
    if (text.toLowerCase() === 'off') return null;
    const match = /^(\d{1,2}):(\d{2})$/.exec(text);
    if (!match || Number(match[1]) > 23 || Number(match[2]) > 59) {
      context.addIssue({ code: 'custom', message: `"${text}" is not a time of day HH:MM (24 h) or "off"` });
      return z.NEVER;
    }
    return `${match[1].padStart(2, '0')}:${match[2]}`;
  });

const unitsArguments = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.enum(['us', 'metric'], { error: 'choose "us" (ft, mph, °F) or "metric" (m, km/h, °C)' }));

export type ParsedCommand = { ok: true; command: Command } | { ok: false; error: string };

/** Parses the text typed after the slash command. Never throws. */
export function parseCommand(rawText: string): ParsedCommand {
  const text = rawText.replace(/\s+/g, ' ').trim();
  if (text.length === 0) return { ok: true, command: { verb: 'help' } };
  if (text.length > 300) return { ok: false, error: 'That command is longer than 300 characters. Try: `44.8N 115.4W`' };
  const [firstWord] = text.split(' ');
  const verb = VERBS.find((candidate) => candidate === firstWord.toLowerCase());
  const rest = verb ? text.slice(firstWord.length).trim() : text;
  const fail = (forVerb: Verb, issues: z.ZodError): ParsedCommand => ({
    ok: false,
    error: `${forVerb === 'lookup' ? 'Lookup' : `"${forVerb}"`}: ${issues.issues[0].message}. Try: \`${COMMAND_EXAMPLES[forVerb].example}\``,
  });
  switch (verb) {
    case undefined: {
      const place = placeRef.safeParse(rest);
      return place.success ? { ok: true, command: { verb: 'lookup', place: place.data } } : fail('lookup', place.error);
    }
    case 'detail': {
      const parsed = detailArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, ...parsed.data } } : fail(verb, parsed.error);
    }
    case 'save': {
      const parsed = saveArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, ...parsed.data } } : fail(verb, parsed.error);
    }
    case 'forget': {
      const parsed = placeName.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, name: parsed.data } } : fail(verb, parsed.error);
    }
    case 'watch':
    case 'unwatch': {
      const parsed = placeRef.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, place: parsed.data } } : fail(verb, parsed.error);
    }
    case 'threshold': {
      const parsed = thresholdArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, ...parsed.data } } : fail(verb, parsed.error);
    }
    case 'mute': {
      const parsed = muteArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, ...parsed.data } } : fail(verb, parsed.error);
    }
    case 'unmute': {
      const parsed = unmuteArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, ...parsed.data } } : fail(verb, parsed.error);
    }
    case 'morning': {
      const parsed = morningArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, localTime: parsed.data } } : fail(verb, parsed.error);
    }
    case 'units': {
      const parsed = unitsArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb, unitSystem: parsed.data } } : fail(verb, parsed.error);
    }
    case 'places':
    case 'watching':
    case 'rules':
    case 'help': {
      const parsed = noArguments.safeParse(rest);
      return parsed.success ? { ok: true, command: { verb } } : fail(verb, parsed.error);
    }
  }
}
