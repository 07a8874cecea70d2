/**
 * `npm run bench`: every speed and memory figure as one JSON document. Not a test: nothing here
 * fails on a slow machine; each section reports its goals beside its figures.
 */
import { browserLatencyBench } from './browser-latency-bench';
import { collabBench } from './collab-bench';
import { editorFpsBench } from './editor-fps-bench';
import { engineBench } from './engine-bench';
import { liveEditGateBench } from './live-edit-gate-bench';
import { renderBench } from './render-bench';

const engine = await engineBench();
const collaboration = { ...(await collabBench()), liveEditCheck: liveEditGateBench() };
const renders = await renderBench();
const browserLatency = await browserLatencyBench();
const editor = await editorFpsBench();
process.stdout.write(`${JSON.stringify({ ...engine, collaboration, renders, browserLatency, editor }, null, 2)}\n`);
