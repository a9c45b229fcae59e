/**
 * The fonts our pictures are drawn with. resvg reads a font's whole file again for every run of
 * text it lays out (the 760 kB DejaVu Sans about ten times per label), which made text most of a
 * picture's cost. Subsets of DejaVu Sans with only the characters below, 43-48 kB each, draw the
 * same pixels at a fraction of the cost; a picture with any other character (a place name in
 * another script) is drawn with the full fonts. The subsets are made by
 * `npx tsx scripts/subsetChartFonts.ts` from the DejaVu files of Debian's fonts-dejavu-core, and
 * ship under their licence (assets/fonts/LICENSE-DejaVu.txt).
 */
import { existsSync } from 'node:fs';
import { packagePath } from '../packageRoot.ts';

const FULL_FONT_DIR = '/usr/share/fonts/truetype/dejavu';
export const FULL_FONT_FILES = ['DejaVuSans.ttf', 'DejaVuSans-Bold.ttf'].map((file) => `${FULL_FONT_DIR}/${file}`);
export const SUBSET_FONT_FILES = ['DejaVuSans-subset.ttf', 'DejaVuSans-Bold-subset.ttf'].map((file) => packagePath('assets', 'fonts', file));

/** Inclusive code-point ranges kept in the subsets: Latin (with Latin-1 and Extended-A), Greek, and the punctuation, superscripts, arrows and signs our labels use. */
const COVERED_RANGES: ReadonlyArray<readonly [number, number]> = [
  [0x20, 0x7e],
  [0xa0, 0x17f],
  [0x370, 0x3ff],
  [0x2010, 0x2027],
  [0x2030, 0x2033],
  [0x2070, 0x2079],
  [0x2190, 0x2193],
  [0x2212, 0x2212],
  [0x221e, 0x221e],
  [0x222b, 0x222b],
  [0x2248, 0x2248],
  [0x2260, 0x2260],
  [0x2264, 0x2265],
];

/** Code points no character is assigned to (Unicode category Cn) are left out: a font has no glyph for them. */
const UNASSIGNED = /\p{Cn}/u;

/** Every covered character, in code-point order (what the subsetting script keeps). */
export const CHART_FONT_COVERAGE: string = COVERED_RANGES.flatMap(([from, to]) => Array.from({ length: to - from + 1 }, (_, index) => String.fromCodePoint(from + index)))
  .filter((character) => !UNASSIGNED.test(character))
  .join('');

const coveredCodePoints = new Set([...CHART_FONT_COVERAGE].map((character) => character.codePointAt(0)!));

/** True when every character of `text` (an SVG, markup and all) is in the subsets; line breaks and tabs count as covered. */
export function subsetCovers(text: string): boolean {
  for (let index = 0; index < text.length; index += 1) {
    const unit = text.charCodeAt(index);
    if (unit < 0x7f) continue;
    if (!coveredCodePoints.has(text.codePointAt(index)!)) return false;
  }
  return true;
}

/** The font files to draw with: the subsets for covered text, else the full DejaVu files; only those present. */
export function chartFontFiles(covered: boolean): string[] {
  const preferred = covered && SUBSET_FONT_FILES.every((file) => existsSync(file)) ? SUBSET_FONT_FILES : FULL_FONT_FILES;
  return preferred.filter((file) => existsSync(file));
}
