// The channel thresholds' defaults as the shared settings schema declares them.
import { ChannelSettingsSchema, type ReadoutThresholds, type ReadoutVerdict } from '@midgray/shared';

const defaults = ChannelSettingsSchema.parse({});
/** Default SNR and ΔE00 thresholds (shared ChannelSettingsSchema). */
export const DEFAULT_THRESHOLDS: ReadoutThresholds = { snrThresholdDb: defaults.snrThresholdDb, deltaEThreshold: defaults.deltaEThreshold };
export type { ReadoutThresholds, ReadoutVerdict };
