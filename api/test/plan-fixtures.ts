// Generator inputs and an episode factory shared by the plan API tests and the route matrix.
import { Episode } from '@midgray/db';

/** An ISO sweep 100–1600 in full stops at f/4, 180° at 24 fps, with ND 0.3–1.2 on hand. */
export const ISO_SWEEP_INPUT = {
  baseIso: 100,
  minIso: 100,
  maxIso: 1600,
  step: 'full',
  base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24, ndDensity: 0 },
  kit: { minFNumber: 1.4, maxFNumber: 16, ndDensities: [0.3, 0.6, 0.9, 1.2], shutterAngles: [180], lightsDimmable: false, lightDownStops: 0, lightUpStops: 0 },
  priority: ['nd', 'aperture', 'shutter', 'light'],
} as const;

/** A latitude bracket ±2 stops in full stops at ISO 800, f/4, 180° at 24 fps. */
export const BRACKET_INPUT = {
  baseIso: 800,
  base: { fNumber: 4, shutter: { kind: 'angle', angleDeg: 180 }, fps: 24, ndDensity: 0.6 },
  maxOffsetStops: 2,
  step: 'full',
  kit: { minFNumber: 1.4, maxFNumber: 16, ndDensities: [0, 0.3, 0.6, 0.9, 1.2], shutterAngles: [180], lightsDimmable: false, lightDownStops: 0, lightUpStops: 0 },
  priority: ['nd', 'aperture', 'shutter', 'light'],
} as const;

/** Creates an episode in `channelId` straight in the database (the board's API is not needed here). */
export async function makeEpisode(channelId: string, title = 'Plan test episode') {
  return Episode.create({ channelId, title, stage: 'plan', position: 0 });
}
