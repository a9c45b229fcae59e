/**
 * A tiny runner for the NCAR Command Language (Debian's ncl-ncarg), used by the external checks and
 * the benchmark: writes a script to a temporary file, runs `ncl -Q`, and reads back the numbers the
 * script printed on lines tagged with a key, e.g. `print("LCL " + sprintf("%.6f", x))`.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const NCL_DATA_DIR = '/usr/share/ncarg/data/asc';

export function nclAvailable(): boolean {
  return spawnSync('ncl', ['-V'], { encoding: 'utf8' }).status === 0;
}

/** Runs an NCL script and returns its standard output. Throws with NCL's output on failure. */
export function runNcl(script: string, timeoutMs = 60_000): string {
  const directory = mkdtempSync(join(tmpdir(), 'lapsewatch-ncl-'));
  const file = join(directory, 'check.ncl');
  try {
    writeFileSync(file, script);
    const output = execFileSync('ncl', ['-Q', file], { encoding: 'utf8', timeout: timeoutMs, maxBuffer: 64 * 1024 * 1024 });
    if (/fatal:/i.test(output)) throw new Error(`NCL reported an error:\n${output}`);
    return output;
  } finally {
    rmSync(directory, { recursive: true, force: true });
  }
}

/** All numbers printed on lines tagged `key`, in order (NCL prefixes printed strings with "(0)\t"). */
export function nclValues(output: string, key: string): number[] {
  const values: number[] = [];
  const pattern = new RegExp(`^(?:\\(\\d+\\)\\s+)?${key}\\s+(.*)$`);
  for (const line of output.split('\n')) {
    const match = pattern.exec(line.trim());
    if (!match) continue;
    for (const token of match[1].trim().split(/\s+/)) values.push(Number(token));
  }
  return values;
}

/** An NCL double literal: exponent marker d, e.g. 9.5d-07 (NCL rejects 9.5e-07d). */
export function nclDouble(value: number): string {
  return value.toExponential(14).replace('e+', 'd').replace('e-', 'd-');
}

/** An NCL array literal of doubles, e.g. (/1.0d3, 8.5d2/). */
export function nclDoubles(values: ArrayLike<number>): string {
  return `(/${Array.from(values, nclDouble).join(', ')}/)`;
}

/**
 * NCL lines that print every element of a 1-D variable on one tagged line each (a loop, because
 * `print` of an array adds indices and headers).
 */
export function nclPrintEach(key: string, variable: string): string {
  return `do i_ = 0, dimsizes(${variable}) - 1\n  print("${key} " + sprintf("%.8g", ${variable}(i_)))\nend do\n`;
}
