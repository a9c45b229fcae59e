/**
 * Wind barbs for the skew-T's wind column, drawn the way weather charts draw them (common practice
 * on station plots and soundings, written here from memory): the staff points from the level's
 * point toward where the wind blows from; at its far end a flag (filled triangle) is 50 kt, a full
 * feather 10 kt, a half feather 5 kt; the speed is rounded to the nearest 5 kt; under 2.5 kt the
 * wind is calm, a small circle. Feathers sit on the clockwise side of the staff (the
 * Northern-Hemisphere habit); a lone half feather is set in from the tip so it cannot be read as
 * a full one.
 */
import { px } from './svgMarkup.ts';

export const KNOTS_PER_METRE_PER_SECOND = 3600 / 1852;

export interface BarbParts {
  calm: boolean;
  flags: number;
  fullFeathers: number;
  halfFeathers: number;
  /** The speed the barb shows, kt (a multiple of 5). */
  shownKt: number;
}

/** How a speed is drawn: flags, full and half feathers of the speed rounded to 5 kt. */
export function barbParts(speedKt: number): BarbParts {
  const shownKt = Math.round(speedKt / 5) * 5;
  if (!(shownKt >= 5)) return { calm: true, flags: 0, fullFeathers: 0, halfFeathers: 0, shownKt: 0 };
  const flags = Math.floor(shownKt / 50);
  const fullFeathers = Math.floor((shownKt - 50 * flags) / 10);
  const halfFeathers = (shownKt - 50 * flags - 10 * fullFeathers) / 5;
  return { calm: false, flags, fullFeathers, halfFeathers, shownKt };
}

const STAFF_PX = 30;
const FEATHER_PX = 11;
const SPACING_PX = 4.5;
const FLAG_BASE_PX = 6;

/**
 * One barb as SVG, its staff starting at (x, y). `fromDeg` is the direction the wind blows from,
 * degrees clockwise from north (north is up on the page).
 */
export function windBarbSvg(x: number, y: number, fromDeg: number, speedKt: number, colour: string): string {
  const parts = barbParts(speedKt);
  if (parts.calm) return `<circle class="wind-calm" cx="${px(x)}" cy="${px(y)}" r="3.5" fill="none" stroke="${colour}" stroke-width="1.2"/>`;
  const radians = (fromDeg * Math.PI) / 180;
  // Unit vector along the staff, toward the wind's origin (page y grows downward).
  const sx = Math.sin(radians);
  const sy = -Math.cos(radians);
  // The clockwise side of the staff on the page.
  const fx = -sy;
  const fy = sx;
  // A point `along` the staff from its start, moved `out` to the feather side and `back` toward the start.
  const at = (along: number, out = 0, back = 0): [number, number] => [x + sx * (along - back) + fx * out, y + sy * (along - back) + fy * out];
  const line = ([x1, y1]: [number, number], [x2, y2]: [number, number]) => `<line x1="${px(x1)}" y1="${px(y1)}" x2="${px(x2)}" y2="${px(y2)}"/>`;
  const shapes = [line([x, y], at(STAFF_PX))];
  let along = STAFF_PX;
  for (let flag = 0; flag < parts.flags; flag += 1) {
    const corners = [at(along), at(along, FEATHER_PX, FLAG_BASE_PX / 2), at(along - FLAG_BASE_PX)];
    shapes.push(`<polygon points="${corners.map(([cx, cy]) => `${px(cx)},${px(cy)}`).join(' ')}" fill="${colour}"/>`);
    along -= FLAG_BASE_PX + 1.5;
  }
  // A lone half feather starts one step in from the tip.
  if (parts.flags === 0 && parts.fullFeathers === 0) along -= SPACING_PX;
  for (let feather = 0; feather < parts.fullFeathers; feather += 1) {
    // Feathers lean toward the tip, as drawn by hand.
    shapes.push(line(at(along), at(along, FEATHER_PX, -3)));
    along -= SPACING_PX;
  }
  if (parts.halfFeathers > 0) shapes.push(line(at(along), at(along, FEATHER_PX / 2, -1.5)));
  return `<g class="wind-barb" data-kt="${parts.shownKt}" stroke="${colour}" stroke-width="1.3" stroke-linecap="round">${shapes.join('')}</g>`;
}
