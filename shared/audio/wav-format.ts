/** Sample formats a WAV file can be written in: 16- or 24-bit PCM (dithered) or 32-bit float. */
export const WAV_FORMATS = ['pcm16', 'pcm24', 'f32'] as const;
export type WavFormat = (typeof WAV_FORMATS)[number];

/** How a render's level is set before writing: peak to a ceiling, or left in physical units. */
export const NORMALIZE_MODES = ['peak', 'none'] as const;
export type NormalizeMode = (typeof NORMALIZE_MODES)[number];

/** Peak ceiling of a peak-normalised render, dBFS. */
export const DEFAULT_PEAK_CEILING_DBFS = -1;

/** Peak level of audition previews, dBFS: well under full scale, so a first listen is never loud. */
export const AUDITION_PEAK_DBFS = -12;
