import { describe, expect, it } from 'vitest';
import { COMMAND_EXAMPLES, parseCommand } from '../../src/router/commandGrammar.ts';

describe('parseCommand', () => {
  it('reads the bare form as a lookup of a point or a place name', () => {
    expect(parseCommand('44.8N 115.4W')).toEqual({ ok: true, command: { verb: 'lookup', place: { kind: 'point', latitudeDeg: 44.8, longitudeDeg: -115.4 } } });
    expect(parseCommand('  Cinder   Ridge ')).toEqual({ ok: true, command: { verb: 'lookup', place: { kind: 'name', name: 'Cinder Ridge' } } });
  });

  it('reads save with a multi-word name and a point in any accepted form', () => {
    expect(parseCommand('save Cinder Ridge 44.81,-115.43')).toEqual({ ok: true, command: { verb: 'save', name: 'Cinder Ridge', latitudeDeg: 44.81, longitudeDeg: -115.43 } });
    expect(parseCommand('save Camp 2 44.8 N, 115.4 W')).toEqual({ ok: true, command: { verb: 'save', name: 'Camp 2', latitudeDeg: 44.8, longitudeDeg: -115.4 } });
  });

  it('reads detail with an hour and a day', () => {
    expect(parseCommand('detail Cinder Ridge 15 tomorrow')).toEqual({ ok: true, command: { verb: 'detail', place: { kind: 'name', name: 'Cinder Ridge' }, localHour: 15, dayOffset: 1 } });
    expect(parseCommand('detail 44.8,-115.4')).toEqual({ ok: true, command: { verb: 'detail', place: { kind: 'point', latitudeDeg: 44.8, longitudeDeg: -115.4 }, localHour: null, dayOffset: 0 } });
  });

  it('reads the channel settings', () => {
    expect(parseCommand('morning 6:30')).toEqual({ ok: true, command: { verb: 'morning', localTime: '06:30' } });
    expect(parseCommand('morning off')).toEqual({ ok: true, command: { verb: 'morning', localTime: null } });
    expect(parseCommand('units US')).toEqual({ ok: true, command: { verb: 'units', unitSystem: 'us' } });
    expect(parseCommand('threshold hdw-above 300')).toEqual({ ok: true, command: { verb: 'threshold', ruleId: 'hdw-above', value: 300 } });
    expect(parseCommand('unmute hdw-above Cinder Ridge')).toEqual({ ok: true, command: { verb: 'unmute', ruleId: 'hdw-above', place: { kind: 'name', name: 'Cinder Ridge' } } });
    expect(parseCommand('unmute hdw-above 44.3,-116.9')).toEqual({ ok: true, command: { verb: 'unmute', ruleId: 'hdw-above', place: { kind: 'point', latitudeDeg: 44.3, longitudeDeg: -116.9 } } });
    expect(parseCommand('unmute hdw-above')).toEqual({ ok: true, command: { verb: 'unmute', ruleId: 'hdw-above', place: null } });
    expect(parseCommand('mute hdw-above Cinder Ridge')).toEqual({ ok: true, command: { verb: 'mute', ruleId: 'hdw-above', place: { kind: 'name', name: 'Cinder Ridge' } } });
    expect(parseCommand('MUTE hdw-above 44.3N 116.9W')).toEqual({ ok: true, command: { verb: 'mute', ruleId: 'hdw-above', place: { kind: 'point', latitudeDeg: 44.3, longitudeDeg: -116.9 } } });
    expect(parseCommand('threshold hdw-above default')).toEqual({ ok: true, command: { verb: 'threshold', ruleId: 'hdw-above', value: 'default' } });
    expect(parseCommand('')).toEqual({ ok: true, command: { verb: 'help' } });
  });

  it.each([
    ['morning 25:00', /"morning": "25:00" is not a time of day.*Try: `morning 06:30`/],
    ['units furlongs', /"units": choose "us".*Try: `units us`/],
    ['threshold hdw-above lots', /"threshold": "lots" is not a number/],
    ['unmute', /"unmute": a rule id is needed.*Try: `unmute hdw-above Cinder Ridge`/],
    ['mute', /"mute": a rule id is needed, then a place\. Try: `mute hdw-above Cinder Ridge`/],
    ['mute hdw-above', /"mute": a place is needed after "hdw-above": a mute holds at one place/],
    ['mute Hdw! Cinder Ridge', /"mute": "Hdw!" is not a rule id/],
    ['unmute HDW!', /"unmute": "HDW!" is not a rule id/],
    ['unmute hdw-above 95,10', /"unmute": .*latitude/i],
    ['save Cinder Ridge', /"save": a name and then a point/],
    ['95N 10E', /Lookup: latitude 95 is outside/],
    ['places now', /"places": takes nothing after it/],
    ['detail Ridge 31', /hour 31 is not 0–23/],
    ['watch', /"watch": a place name or LAT,LON is needed/],
    ['$$$', /Lookup: a place name uses letters/],
  ])('gives one line with the reason and a correct example for %s', (text, expected) => {
    const parsed = parseCommand(text);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) {
      expect(parsed.error).toMatch(expected);
      expect(parsed.error).not.toContain('\n');
    }
  });

  it('has an example for every command that itself parses to that command', () => {
    for (const [verb, { example }] of Object.entries(COMMAND_EXAMPLES)) {
      const parsed = parseCommand(example);
      expect(parsed.ok && parsed.command.verb).toBe(verb);
    }
  });
});
