/** The options of `lapsewatch analyze`, parsed. */
export interface AnalyzeArguments {
  file: string | null;
  json: boolean;
  ndjson: boolean;
  surfaceTemperatureC: number | null;
  virtualTemperature: boolean;
  help: boolean;
}

export type ParsedAnalyzeArguments = { ok: true; value: AnalyzeArguments } | { ok: false; error: string };

export const ANALYZE_USAGE = `Usage:
  lapsewatch analyze [FILE] [--json] [--surface-temp C] [--no-virtual]
  lapsewatch analyze --ndjson [--surface-temp C] [--no-virtual] < profiles.ndjson

Reads one forecast profile (JSON, or CSV with a header and the surface on the first row) and
reports how stable each layer is, the mixing height, dry near-dry-adiabatic layers aloft with the
surface temperature that reaches them, and the fire-weather indices.
With no FILE, analyses the bundled invented demo profile (config/demo-profile.json).

Options:
  --json              print one JSON object (the full analysis) instead of the readout
  --ndjson            read one JSON profile per line on standard input, write one JSON result
                      per line; a line that cannot be analysed gets {"line": N, "error": "..."}
                      and the batch goes on (empty lines are skipped)
  --surface-temp C    analyse the afternoon: the surface temperature becomes C (°C), which moves
                      the surface parcel and the mixing height
  --no-virtual        lift parcels without the virtual temperature correction
  -h, --help          show this help

Exit codes: 0 done; 1 a file or profile could not be analysed (in --ndjson: at least one line
failed); 2 the command line is wrong.
`;

/** Parses the words after `analyze`. Options may come before or after FILE; `--surface-temp=C` also works. */
export function parseAnalyzeArguments(args: readonly string[]): ParsedAnalyzeArguments {
  const value: AnalyzeArguments = { file: null, json: false, ndjson: false, surfaceTemperatureC: null, virtualTemperature: true, help: false };
  for (let i = 0; i < args.length; i++) {
    const word = args[i];
    const [flag, inlineValue] = word.startsWith('--') && word.includes('=') ? [word.slice(0, word.indexOf('=')), word.slice(word.indexOf('=') + 1)] : [word, undefined];
    switch (flag) {
      case '--json':
      case '--ndjson':
      case '--no-virtual':
      case '--help':
      case '-h':
        if (inlineValue !== undefined) return { ok: false, error: `${flag} takes no value` };
        if (flag === '--json') value.json = true;
        else if (flag === '--ndjson') value.ndjson = true;
        else if (flag === '--no-virtual') value.virtualTemperature = false;
        else value.help = true;
        break;
      case '--surface-temp': {
        const text = inlineValue ?? args[++i];
        if (text === undefined || text.trim() === '') return { ok: false, error: '--surface-temp needs a temperature in °C, e.g. --surface-temp 34' };
        const temperatureC = Number(text);
        if (!Number.isFinite(temperatureC)) return { ok: false, error: `--surface-temp "${text}" is not a number; give °C, e.g. --surface-temp 34` };
        if (temperatureC < -60 || temperatureC > 60) return { ok: false, error: `--surface-temp ${temperatureC} °C is outside −60 to 60 °C; is it in °F or K?` };
        value.surfaceTemperatureC = temperatureC;
        break;
      }
      default:
        if (word.startsWith('-') && word !== '-') return { ok: false, error: `unknown option "${word}"` };
        if (value.file !== null) return { ok: false, error: `one FILE at a time (got "${value.file}" and "${word}")` };
        value.file = word;
    }
  }
  if (value.ndjson && value.file !== null) return { ok: false, error: `--ndjson reads profiles from standard input; leave out FILE ("${value.file}")` };
  return { ok: true, value };
}
