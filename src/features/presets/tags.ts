/** Tags as people type them: comma-separated, trimmed, empty pieces dropped (the server lower-cases). */
export function parseTags(text: string): string[] {
  return text
    .split(',')
    .map((tag) => tag.trim())
    .filter(Boolean);
}

/** Every tag used by the given presets, once each, in alphabetical order. */
export function tagsInUse(presets: ReadonlyArray<{ tags: string[] }>): string[] {
  return [...new Set(presets.flatMap((preset) => preset.tags))].sort((a, b) => a.localeCompare(b));
}

/** The message to show beside a tags field, from field errors keyed `tags` or `tags[2]` (naming that tag). */
export function tagsError(errors: Record<string, string>): string | undefined {
  for (const [field, message] of Object.entries(errors)) {
    if (field === 'tags') return message;
    const index = /^tags\[(\d+)\]/.exec(field);
    if (index) return `Tag ${Number(index[1]) + 1}: ${message.charAt(0).toLowerCase()}${message.slice(1)}`;
  }
  return undefined;
}
