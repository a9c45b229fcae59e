// Makes the chart fonts' subsets (assets/fonts/*-subset.ttf) from the full DejaVu Sans files of
// Debian's fonts-dejavu-core: the characters in src/render/chartFonts.ts, without hinting (resvg
// draws outlines unhinted). Run again when that character list changes:
//   npx tsx scripts/subsetChartFonts.ts
// subset-font (HarfBuzz's subsetter) does the work; it is a dev dependency, used only here.
import { readFileSync, writeFileSync } from 'node:fs';
import subsetFont from 'subset-font';
import { CHART_FONT_COVERAGE, FULL_FONT_FILES, SUBSET_FONT_FILES } from '../src/render/chartFonts.ts';

// subset-font 2.9 takes `noHinting`; its published types (@types/subset-font 2.3) predate it.
const options = { targetFormat: 'truetype', noHinting: true } as Parameters<typeof subsetFont>[2];

for (const [index, full] of FULL_FONT_FILES.entries()) {
  const subset = await subsetFont(readFileSync(full), CHART_FONT_COVERAGE, options);
  writeFileSync(SUBSET_FONT_FILES[index]!, subset);
  console.log(`${SUBSET_FONT_FILES[index]}: ${subset.length} bytes from ${full}`);
}
