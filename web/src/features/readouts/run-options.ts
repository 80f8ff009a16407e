// Measurement options of the Readouts tab, shared by "Run readouts" and each step's "Run again".
import type { ReadoutGrid, ReadoutKind, RunReadoutsInput, TransferName } from '@midgray/shared';

export interface RunOptions {
  grid: ReadoutGrid | null;
  transfer: TransferName | 'auto';
  /** As typed: empty = the middle of each video. */
  frameTimeSeconds: string;
}

export const DEFAULT_RUN_OPTIONS: RunOptions = { grid: null, transfer: 'auto', frameTimeSeconds: '' };

/** The request body for the options; fields left at their defaults are not sent (the server decides). */
export function runInput(options: RunOptions, kind: ReadoutKind): RunReadoutsInput {
  const input: RunReadoutsInput = {};
  if (kind === 'noise' && options.grid) input.grid = options.grid;
  if (options.transfer !== 'auto') input.transfer = options.transfer;
  const t = options.frameTimeSeconds.trim() === '' ? null : Number(options.frameTimeSeconds);
  if (t !== null && Number.isFinite(t) && t >= 0) input.frameTimeSeconds = t;
  return input;
}
