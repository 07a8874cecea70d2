/**
 * The render endpoints the browser opens itself (links and the audio player), not through
 * apiRequest: the file as an attachment, the WAV inline for playing, and the patch snapshot.
 */

/** `GET /api/renders/:id/file`: the WAV (single) or the ZIP (note set), as an attachment. */
export const renderFileUrl = (renderId: string) => `/api/renders/${renderId}/file`;

/** `GET /api/renders/:id/file?inline=1`: a single render's WAV, served for playing in the page. */
export const renderPlayUrl = (renderId: string) => `/api/renders/${renderId}/file?inline=1`;

/** `GET /api/renders/:id/patch.json`: the patch exactly as it was when the render was asked for. */
export const renderPatchUrl = (renderId: string) => `/api/renders/${renderId}/patch.json`;
