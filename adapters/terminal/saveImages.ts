import { mkdir, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import type { MessageImage } from '../../src/render/message.ts';

/** A terminal cannot show a PNG: write it under the data folder and print where it is. */
export async function saveImages(images: MessageImage[], folder: string, stampMs: number): Promise<string[]> {
  if (images.length === 0) return [];
  await mkdir(folder, { recursive: true });
  const paths: string[] = [];
  for (const image of images) {
    const path = join(folder, `${stampMs}-${image.fileName.replace(/[^\w.-]/g, '_')}`);
    await writeFile(path, image.png);
    paths.push(path);
  }
  return paths;
}
