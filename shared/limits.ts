/**
 * Every limit of the product in one place. The patch schema, the server and the client
 * read these; nothing else spells a limit as a literal.
 */
export const LIMITS = {
  /** Sample rates a patch may ask for, in Hz. */
  sampleRatesHz: [44100, 48000, 88200, 96000] as const,
  /** A render lasts more than 0 and at most this many seconds. */
  maxDurationS: 60,
  /** Highest number of modes a patch may keep. */
  maxModes: 4096,
  /** Most points in one polyline (displacement or velocity). */
  maxPolylinePoints: 10_000,
  /** Fewest points in one polyline: the two supports. */
  minPolylinePoints: 2,
  /** Most plucks and strikes one excitation may be made of (a double pluck, a pluck plus a strike, …). */
  maxExcitationParts: 8,
  /** Narrowest contact a pluck or strike may have, in metres (0.1 mm: narrower is a knife edge). */
  minContactWidthM: 1e-4,
  /** Longest patch name, in characters. */
  maxNameLength: 200,
  /** Largest inharmonicity coefficient B accepted (real strings are below 0.01). */
  maxInharmonicityB: 1,
  /** Password length bounds. */
  minPasswordLength: 10,
  maxPasswordLength: 200,
  /**
   * Per-account limits (besides the per-address limit on sign-in, register and reset): failed
   * sign-ins per e-mail address, wrong current passwords per account, and invitation e-mails per
   * studio and address. Over a limit the server answers 429 with Retry-After.
   */
  signInFailuresPerAccount: { windowS: 15 * 60, limit: 10 },
  passwordChecksPerAccount: { windowS: 15 * 60, limit: 5 },
  invitationMailsPerAddress: { windowS: 60 * 60, limit: 5 },
  /** Longest display name, studio, session or preset name, in characters. */
  maxLabelLength: 120,
  /** Most tags on one preset, and the longest tag. */
  maxPresetTags: 12,
  maxTagLength: 32,
  /** Largest JSON request body the API reads, in bytes (a 10,000-point patch is about 0.3 MB). */
  maxRequestBodyBytes: 2 * 1024 * 1024,
  /** A preset's audition file: at most this long; every preview at no more than this rate. */
  previewMaxDurationS: 4,
  previewMaxSampleRateHz: 48000,
  /**
   * The live preview the server sends while people edit: as long as the patch up to this many
   * seconds, and at most previewMaxSamples samples (a long preview is sent at a lower standard
   * rate: 12 s at 24 kHz is 1.15 MB of Float32 per result, not 2.3 MB at 48 kHz).
   */
  livePreviewMaxDurationS: 12,
  previewMaxSamples: 288_000,
  /** Preset audition files: rendered at most this many at once off the event loop, this many more waiting (then 503), kept up to this many bytes. */
  presetPreviewMaxRendering: 2,
  presetPreviewMaxWaiting: 8,
  presetPreviewCacheBytes: 64 * 1024 * 1024,
  /** Seconds a refused preset audition is told to wait (Retry-After). */
  presetPreviewRetryAfterS: 2,
  /**
   * A mode table as the server sends it (shared/protocol/mode-table-wire.ts): at most this many
   * bytes (4,096 modes take 32.9 KB), with a state vector of at most this many bytes (a longer one
   * is left out of the table).
   */
  modeTableMaxBytes: 64 * 1024,
  modeTableMaxStateVectorBytes: 4096,
  /** Fewest milliseconds between two compute results sent to one session (one per display frame). */
  computeMinIntervalMs: 16,
  /** Largest websocket message the collaboration endpoint accepts, in bytes. */
  maxCollabMessageBytes: 4 * 1024 * 1024,
  /** Render jobs: a decay-cut render stops at most this long (and never before the shortest). */
  renderMaxDurationS: 60,
  renderMinDurationS: 0.05,
  /** The decay threshold a render may be cut at, dB relative to its peak. */
  renderDecayThresholdDb: { min: -120, max: -30 },
  /** Fade applied at a decay cut, milliseconds. */
  renderFadeMs: { min: 0, max: 500 },
  /** Fade that ends a fixed-length render whose settings name none, milliseconds. */
  renderFixedFadeMs: 10,
  /** Normalisation targets a render may ask for. */
  renderPeakCeilingDbfs: { min: -30, max: 0 },
  renderLoudnessTargetLufs: { min: -40, max: -6 },
  renderTruePeakCeilingDbtp: { min: -12, max: 0 },
  /** Longest render name, in characters. */
  maxRenderNameLength: 120,
  /** A multi-note set: at most this many notes and strengths, and files in all. */
  noteSetMaxNotes: 49,
  noteSetMaxStrengths: 5,
  noteSetMaxFiles: 128,
  /** Each note of a set lasts at most this long. */
  noteSetMaxDurationS: 20,
  /** Render storage per studio (files under data/renders), bytes; RENDER_QUOTA_BYTES overrides it. */
  renderQuotaBytes: 2 * 1024 * 1024 * 1024,
  /** Queued or running render jobs one studio may have at once. */
  maxQueuedRendersPerStudio: 8,
  /**
   * Fields a patch carries beside the physics (designer notes such as material or target pitch):
   * the deepest nesting anywhere in a patch (a polyline point is 4 levels down), and the total
   * size of all such fields, as JSON text. Deeper or larger input is refused before anything is stored.
   */
  maxPatchNestingDepth: 16,
  maxPassThroughBytes: 64 * 1024,
  /** The live document of a session, encoded: larger is refused (a 10,000-point patch is about 0.5 MB). */
  maxLiveDocumentBytes: 8 * 1024 * 1024,
  /** Largest patch JSON file the command line reads, in bytes. */
  maxPatchFileBytes: 4 * 1024 * 1024,
  /** Longest id (a session's, a studio's) a socket message may carry; ids are 36-character UUIDs. */
  maxSocketIdLength: 64,
} as const;

export type AllowedSampleRateHz = (typeof LIMITS.sampleRatesHz)[number];
