import { waveformBuffers, analysisBuffers } from './preview-analysis';
import { TableRefused, type SynthesisEngine, type YieldToEvents } from './synthesis-engine';
import type { SynthesisPort, SynthesisReply, SynthesisRequest } from './synthesis-messages';

/**
 * Serves a SynthesisEngine on a message port: the synthesis worker's body, kept apart from the
 * worker global so a test can run it on a MessageChannel in Node. Each table streams its chunks
 * as they are made; when its preview is complete (and no newer table has come) the charts' data
 * follows. Notes and waveform widths are answered between chunks.
 */
export function serveSynthesis(port: SynthesisPort<SynthesisRequest, SynthesisReply>, engine: SynthesisEngine, yieldToEvents: YieldToEvents): void {
  const send = (reply: SynthesisReply, transfer: Transferable[] = []) => port.postMessage(reply, transfer);
  void engine.kernelInUse().then((kernel) => send({ type: 'kernel', kind: kernel.kind, fallbackReason: kernel.fallbackReason ?? null }));

  const onTable = async (job: number, bytes: Uint8Array, columns: number | null) => {
    try {
      for await (const chunk of engine.onTable(bytes, job)) {
        send({ type: 'chunk', ...chunk }, [chunk.samples.buffer as ArrayBuffer]);
        if (!chunk.complete) continue;
        await yieldToEvents();
        if (!engine.isLatest(job)) return;
        const analysis = engine.analysis(job, columns);
        if (analysis) send({ type: 'analysis', job, analysis }, analysisBuffers(analysis));
      }
    } catch (error) {
      send({ type: 'refused', job, reason: error instanceof TableRefused ? error.message : `synthesis failed: ${error instanceof Error ? error.message : String(error)}` });
    }
  };

  port.onmessage = ({ data: request }) => {
    if (request.type === 'table') void onTable(request.job, request.bytes, request.columns);
    else if (request.type === 'waveform') {
      const waveform = engine.waveform(request.job, request.columns);
      if (waveform) send({ type: 'waveform', job: request.job, waveform }, waveformBuffers(waveform));
    } else if (request.type === 'note') {
      void engine.note(request.patch, request.midiNote).then(async (note) => {
        if ('error' in note) return send({ type: 'note-refused', id: request.id, error: note.error });
        const { kind } = await engine.kernelInUse();
        send({ type: 'note', id: request.id, samples: note.samples, sampleRateHz: note.sampleRateHz, kernel: kind }, [note.samples.buffer as ArrayBuffer]);
      });
    }
  };
}

/**
 * Yields to the event loop through a MessageChannel: no timer clamping (nested timeouts wait 4 ms
 * each), and messages that reached the worker meanwhile (a newer table) are handled first.
 */
export function messageChannelYield(): YieldToEvents {
  const channel = new MessageChannel();
  const waiting: Array<() => void> = [];
  channel.port1.onmessage = () => waiting.shift()?.();
  return () =>
    new Promise<void>((resolve) => {
      waiting.push(resolve);
      channel.port2.postMessage(null);
    });
}
