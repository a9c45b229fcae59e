/** One thing wrong in a config file: which file, which key (dotted path), and why. */
export interface ConfigProblem {
  file: string;
  key: string;
  reason: string;
}

/** "config/rules.yaml: rules.hdw-above.threshold: must be a number from 0 to 5000, got -3". */
export function formatConfigProblem(problem: ConfigProblem): string {
  return `${problem.file}: ${problem.key}: ${problem.reason}`;
}
