import type { ProfileInput } from '../core/profile.ts';
import { describeIssuePath, profileSchema } from './profileSchema.ts';

export type ParsedProfile = { ok: true; profile: ProfileInput } | { ok: false; error: string };

const LEVEL_COLUMNS = ['pressureHpa', 'heightM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs'] as const;
const META_KEYS = ['name', 'validTime', 'latitude', 'longitude'] as const;

const CSV_EXAMPLE =
  'pressureHpa,heightM,temperatureC,dewpointC,windDirDeg,windSpeedMs\n' +
  '870,1250,31.5,2.0,240,4   <- first row: the surface (heightM = ground elevation)\n' +
  '850,1440,29.4,0.5,245,6';

/**
 * Reads one profile from text: JSON (the analyze contract) or CSV (a header naming the level
 * columns, the surface on the first data row). CSV metadata may come as extra columns on the first
 * row or as comment lines such as `# validTime: 2026-08-14T21:00:00Z`. Never throws.
 */
export function parseProfileText(text: string, fileName: string): ParsedProfile {
  const trimmed = text.trim();
  if (trimmed.length === 0) return { ok: false, error: `${fileName}: the file is empty` };
  if (trimmed.startsWith('{')) return parseJsonProfile(trimmed, fileName);
  return parseCsvProfile(trimmed, fileName);
}

function parseJsonProfile(text: string, fileName: string): ParsedProfile {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (error) {
    return { ok: false, error: `${fileName}: not valid JSON (${(error as Error).message})` };
  }
  return validate(raw, fileName);
}

function validate(raw: unknown, fileName: string): ParsedProfile {
  const parsed = profileSchema.safeParse(raw);
  if (!parsed.success) {
    const reasons = parsed.error.issues
      .slice(0, 5)
      .map((issue) => `${describeIssuePath(issue.path) || 'profile'}: ${issue.message}`);
    return { ok: false, error: `${fileName}: ${reasons.join('; ')}` };
  }
  return { ok: true, profile: parsed.data };
}

function parseCsvProfile(text: string, fileName: string): ParsedProfile {
  const metadata: Record<string, string> = {};
  const rows: string[][] = [];
  for (const line of text.split(/\r?\n/)) {
    const content = line.trim();
    if (content.length === 0) continue;
    if (content.startsWith('#')) {
      const match = /^#\s*(\w+)\s*[:=]\s*(.+)$/.exec(content);
      if (match) metadata[match[1]] = match[2].trim();
      continue;
    }
    rows.push(content.split(',').map((cell) => cell.trim()));
  }
  const [header, ...dataRows] = rows;
  if (!header) return { ok: false, error: `${fileName}: no CSV header. Expected:\n${CSV_EXAMPLE}` };
  const missing = LEVEL_COLUMNS.filter((column) => !header.includes(column));
  if (missing.length > 0) {
    return {
      ok: false,
      error: `${fileName}: neither JSON nor a CSV with the columns ${LEVEL_COLUMNS.join(',')} (missing: ${missing.join(', ')}). Example:\n${CSV_EXAMPLE}`,
    };
  }
  if (dataRows.length === 0) return { ok: false, error: `${fileName}: the CSV has a header but no rows; the first row is the surface` };
  const columnIndex = (name: string) => header.indexOf(name);
  const numberAt = (row: string[], rowNumber: number, column: string): number | string => {
    const cell = row[columnIndex(column)];
    if (cell === undefined || cell === '') return `row ${rowNumber}: ${column} is empty`;
    const value = Number(cell);
    return Number.isNaN(value) ? `row ${rowNumber}: ${column} "${cell}" is not a number` : value;
  };
  const records: Record<string, number>[] = [];
  for (const [index, row] of dataRows.entries()) {
    const record: Record<string, number> = {};
    for (const column of LEVEL_COLUMNS) {
      const value = numberAt(row, index + 1, column);
      if (typeof value === 'string') return { ok: false, error: `${fileName}: ${value}` };
      record[column] = value;
    }
    records.push(record);
  }
  const firstRow = dataRows[0];
  for (const key of META_KEYS) {
    const index = columnIndex(key);
    if (index >= 0 && firstRow[index] !== undefined && firstRow[index] !== '') metadata[key] = firstRow[index];
  }
  const [surfaceRecord, ...levelRecords] = records;
  const raw = {
    name: metadata.name ?? fileName.replace(/^.*[\\/]/, '').replace(/\.[^.]+$/, ''),
    validTime: metadata.validTime ?? 'unspecified',
    latitude: metadata.latitude === undefined ? null : Number(metadata.latitude),
    longitude: metadata.longitude === undefined ? null : Number(metadata.longitude),
    surface: {
      pressureHpa: surfaceRecord.pressureHpa,
      elevationM: surfaceRecord.heightM,
      temperatureC: surfaceRecord.temperatureC,
      dewpointC: surfaceRecord.dewpointC,
      windDirDeg: surfaceRecord.windDirDeg,
      windSpeedMs: surfaceRecord.windSpeedMs,
    },
    levels: levelRecords,
  };
  return validate(raw, fileName);
}
