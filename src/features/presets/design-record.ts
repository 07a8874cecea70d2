/** One line of a preset's design record: a readable label and its value as text. */
export interface DesignRecordLine {
  label: string;
  value: string;
}

const UNIT_WORDS: Record<string, string> = { M: 'm', Hz: 'Hz', S: 's', N: 'N', Kg: 'kg' };

/** `targetFrequencyHz` → `target frequency (Hz)`, `lowT60S` → `low T60 (s)`: the unit suffix becomes a bracket. */
export function designLabel(key: string): string {
  const words = key.split(/(?=[A-Z])/).filter(Boolean);
  const last = words.at(-1);
  const unit = words.length > 1 && last !== undefined ? UNIT_WORDS[last] : undefined;
  const named = (unit ? words.slice(0, -1) : words).map((word) => (/^[A-Z][a-z]/.test(word) ? word.toLowerCase() : word)).join(' ');
  return unit ? `${named} (${unit})` : named;
}

function valueText(value: unknown): string {
  if (typeof value === 'number') return value.toLocaleString('en', { maximumSignificantDigits: 6 });
  if (Array.isArray(value)) return value.map(valueText).join(', ');
  return String(value);
}

/**
 * The `design` object a patch may carry (how its numbers were chosen: material, target note, the
 * pluck it was shaped from), flattened into labelled lines; nested objects prefix their parent's
 * label. Anything else, or nothing, gives no lines.
 */
export function designRecordLines(patch: unknown): DesignRecordLine[] {
  const design = typeof patch === 'object' && patch !== null ? (patch as { design?: unknown }).design : undefined;
  const lines: DesignRecordLine[] = [];
  const walk = (value: unknown, prefix: string) => {
    if (typeof value !== 'object' || value === null || Array.isArray(value)) return;
    for (const [key, entry] of Object.entries(value)) {
      const label = prefix ? `${prefix} · ${designLabel(key)}` : designLabel(key);
      if (typeof entry === 'object' && entry !== null && !Array.isArray(entry)) walk(entry, label);
      else if (entry !== undefined && entry !== null && entry !== '') lines.push({ label, value: valueText(entry) });
    }
  };
  walk(design, '');
  return lines;
}
