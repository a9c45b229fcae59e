import { describe, expect, it } from 'vitest';
import { parseCoordinates } from '../../src/router/parseCoordinates.ts';

describe('parseCoordinates', () => {
  it.each([
    ['44.12,-116.2', 44.12, -116.2],
    ['44.12, -116.2', 44.12, -116.2],
    ['44.12N,116.2W', 44.12, -116.2],
    ['44.12 N, 116.2 W', 44.12, -116.2],
    ['116.2W 44.12N', 44.12, -116.2],
    ['33.9S 151.2E', -33.9, 151.2],
    ['-33.9 151.2', -33.9, 151.2],
  ])('reads %s', (text, latitudeDeg, longitudeDeg) => {
    expect(parseCoordinates(text)).toEqual({ kind: 'point', latitudeDeg, longitudeDeg });
  });

  it('leaves place names alone', () => {
    expect(parseCoordinates('Cinder Ridge')).toEqual({ kind: 'not-a-point' });
    expect(parseCoordinates('44.1')).toEqual({ kind: 'not-a-point' });
  });

  it('refuses points that cannot be', () => {
    expect(parseCoordinates('95,10')).toMatchObject({ kind: 'invalid', reason: expect.stringMatching(/latitude 95/) });
    expect(parseCoordinates('45,190')).toMatchObject({ kind: 'invalid', reason: expect.stringMatching(/longitude 190/) });
    expect(parseCoordinates('45N,45N')).toMatchObject({ kind: 'invalid' });
    expect(parseCoordinates('-45N,45W')).toMatchObject({ kind: 'invalid' });
  });
});
