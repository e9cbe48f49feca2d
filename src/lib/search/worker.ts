// Worker-thread entry of the search pool: pure code only, so it runs as TS
// under tsx/vitest and bundled (scripts/build-search-worker.mjs) in production.
import { runSearchTask, type SearchTask } from './runSearchTask';

export default function searchWorker(task: SearchTask) {
  return runSearchTask(task);
}
