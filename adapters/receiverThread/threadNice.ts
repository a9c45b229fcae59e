import { getPriority } from 'node:os';

/** The calling thread's nice value (setpriority acts per thread on Linux), or null where the system will not say. */
export function niceOfThisThread(): number | null {
  try {
    return getPriority(0);
  } catch {
    return null;
  }
}
