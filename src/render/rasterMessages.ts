import type { PngResult } from './drawPng.ts';

/** What the answering thread and the picture thread (rasterWorker.ts) say to each other. */
export interface RasterRequest {
  id: number;
  svg: string;
  /** resvg's render options, as plain data. */
  options: unknown;
}

export type RasterReply = { id: number } & PngResult;
