/**
 * Reads a point typed into a chat: "44.12,-116.2", "44.12 N, 116.2 W", "44.12N 116.2W". Decimal
 * degrees only. Returns null when the text is not a point at all (it may be a place name), or an
 * error when it looks like a point but cannot be one.
 */
export type CoordinatesParse =
  | { kind: 'point'; latitudeDeg: number; longitudeDeg: number }
  | { kind: 'not-a-point' }
  | { kind: 'invalid'; reason: string };

const NUMBER = String.raw`([+-]?\d+(?:\.\d+)?)\s*°?\s*([NSEWnsew])?`;
const POINT_PATTERN = new RegExp(String.raw`^\s*${NUMBER}\s*(?:,|\s)\s*${NUMBER}\s*$`);

export function parseCoordinates(text: string): CoordinatesParse {
  const match = POINT_PATTERN.exec(text);
  if (!match) return { kind: 'not-a-point' };
  const [, firstNumber, firstHemisphere, secondNumber, secondHemisphere] = match;
  const first = applyHemisphere(Number(firstNumber), firstHemisphere);
  const second = applyHemisphere(Number(secondNumber), secondHemisphere);
  const firstIsLongitude = firstHemisphere !== undefined && /[EW]/i.test(firstHemisphere);
  const secondIsLatitude = secondHemisphere !== undefined && /[NS]/i.test(secondHemisphere);
  if (firstIsLongitude !== secondIsLatitude) {
    return { kind: 'invalid', reason: 'give latitude with N/S and longitude with E/W, not both of one kind' };
  }
  if (firstHemisphere !== undefined && Number(firstNumber) < 0) return { kind: 'invalid', reason: 'use either a minus sign or a hemisphere letter, not both' };
  if (secondHemisphere !== undefined && Number(secondNumber) < 0) return { kind: 'invalid', reason: 'use either a minus sign or a hemisphere letter, not both' };
  const [latitudeDeg, longitudeDeg] = firstIsLongitude ? [second, first] : [first, second];
  if (Math.abs(latitudeDeg) > 90) return { kind: 'invalid', reason: `latitude ${latitudeDeg} is outside −90..90` };
  if (Math.abs(longitudeDeg) > 180) return { kind: 'invalid', reason: `longitude ${longitudeDeg} is outside −180..180` };
  return { kind: 'point', latitudeDeg, longitudeDeg };
}

function applyHemisphere(value: number, hemisphere: string | undefined): number {
  return hemisphere !== undefined && /[SW]/i.test(hemisphere) ? -value : value;
}
