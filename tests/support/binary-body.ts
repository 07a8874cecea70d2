import type { Response } from 'superagent';

/** A supertest parser that keeps the body as one Buffer (WAV, ZIP): `.buffer(true).parse(binaryBody)`. */
export function binaryBody(response: Response, done: (error: Error | null, body: Buffer) => void): void {
  const chunks: Buffer[] = [];
  (response as unknown as NodeJS.ReadableStream).on('data', (chunk: Buffer) => chunks.push(chunk));
  (response as unknown as NodeJS.ReadableStream).on('end', () => done(null, Buffer.concat(chunks)));
}
