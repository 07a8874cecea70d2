// Starts a TypeScript worker entry: worker threads on Node 20 do not inherit tsx's loader,
// so register tsx's CommonJS hook here and then load the entry named in workerData.
require('tsx/cjs/api').register();
require(require('node:worker_threads').workerData.entry);
