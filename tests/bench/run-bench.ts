/**
 * `npm run bench`: every speed and memory figure as one JSON document. Not a test: nothing here
 * fails on a slow machine; each section reports its goals beside its figures.
 */
import { collabBench } from './collab-bench';
import { editorFpsBench } from './editor-fps-bench';
import { engineBench } from './engine-bench';

const engine = await engineBench();
const collaboration = await collabBench();
const editor = await editorFpsBench();
process.stdout.write(`${JSON.stringify({ ...engine, collaboration, editor }, null, 2)}\n`);
