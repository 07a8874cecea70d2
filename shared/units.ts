/**
 * Unit aliases used in every signature of the engine. They are plain numbers at run time;
 * the names say which SI unit a value is in so that mixing them is visible in review.
 */
export type Seconds = number;
export type Hertz = number;
export type RadiansPerSecond = number;
export type Metres = number;
export type MetresPerSecond = number;
export type Newtons = number;
export type Pascals = number;
export type Joules = number;
export type KilogramsPerMetre = number;
export type KilogramsPerCubicMetre = number;
/** Decay rate σ of a mode's envelope e^(−σt). */
export type PerSecond = number;
/** The b2 loss coefficient of the two-coefficient loss model. */
export type SquareMetresPerSecond = number;
/** Wavenumber k = nπ/L. */
export type RadiansPerMetre = number;
export type Decibels = number;
/** Decibels relative to digital full scale. */
export type DecibelsFullScale = number;
/**
 * Loudness in loudness units relative to full scale, LUFS (the same scale as LKFS, ITU-R BS.1770-4).
 * A loudness difference of 1 LU is 1 dB.
 */
export type LoudnessUnitsFullScale = number;
export type SampleRate = number;
/** A MIDI note number: 69 is A4, 60 is middle C. Fractional values are allowed (cents). */
export type MidiNote = number;
/** Dimensionless inharmonicity coefficient B of a stiff string. */
export type Inharmonicity = number;
