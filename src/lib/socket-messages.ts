import type { z } from 'zod';
import { parsePayload } from '../../shared/protocol/socket-payloads';

/**
 * Messages from the server that did not match their schema. Each is dropped (the page keeps what it
 * shows); the first one of each event is logged with its field problems, later ones only counted.
 */
export class MalformedMessages {
  private readonly counts = new Map<string, number>();

  constructor(private readonly log: (line: string) => void = (line) => console.warn(line)) {}

  /** How many were dropped, of one event or of all. */
  count(event?: string): number {
    if (event !== undefined) return this.counts.get(event) ?? 0;
    let total = 0;
    for (const n of this.counts.values()) total += n;
    return total;
  }

  note(event: string, problems: readonly string[]): void {
    const seen = this.counts.get(event) ?? 0;
    this.counts.set(event, seen + 1);
    if (seen === 0) this.log(`Tautline: ignored a malformed ${event} message from the server (${problems.join('; ')}); later ones are counted, not logged`);
  }

  /**
   * A socket listener that parses its payload with `schema` and passes on only what matches; it
   * never throws, whatever arrives.
   */
  listener<S extends z.ZodType>(event: string, schema: S, onMessage: (message: z.output<S>) => void): (payload: unknown) => void {
    return (payload) => {
      const parsed = parsePayload(schema, payload);
      if (parsed.ok) onMessage(parsed.value);
      else this.note(event, parsed.issues.map((issue) => issue.message));
    };
  }
}
