import { readFile } from 'node:fs/promises';
import { parseProfileText } from '../profile/parseProfileText.ts';
import type { ProfileInput } from '../core/profile.ts';
import { packagePath } from '../packageRoot.ts';

/** The bundled invented demo profile, analysed when `analyze` is given no file. */
export const DEMO_PROFILE_PATH = packagePath('config', 'demo-profile.json');

export type ReadProfileResult = { ok: true; profile: ProfileInput } | { ok: false; error: string };

/** Reads and parses one profile file ("-" is standard input); every failure is a message naming the file. */
export async function readProfileFile(path: string, stdin: NodeJS.ReadableStream): Promise<ReadProfileResult> {
  let text: string;
  try {
    text = path === '-' ? await readAll(stdin) : await readFile(path, 'utf8');
  } catch (error) {
    const code = (error as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'is a directory, not a file' : code === 'EACCES' ? 'permission denied' : (error as Error).message;
    return { ok: false, error: `${path}: cannot read the file (${why})` };
  }
  return parseProfileText(text, path === '-' ? 'standard input' : path);
}

async function readAll(stream: NodeJS.ReadableStream): Promise<string> {
  const chunks: Buffer[] = [];
  for await (const chunk of stream) chunks.push(typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer));
  return Buffer.concat(chunks).toString('utf8');
}
