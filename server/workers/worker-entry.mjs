// The file each worker thread starts from. Plain JavaScript on purpose: on Node 20 a worker thread
// does not get the ESM loader hooks of `tsx` (a dynamic import of a .ts file fails there), so the
// job module is loaded through tsx's own API, which registers its hooks in this thread.
import { tsImport } from 'tsx/esm/api';

const mod = await tsImport('./task-worker.ts', import.meta.url);
export default mod.default;
