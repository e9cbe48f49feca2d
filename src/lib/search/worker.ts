// Worker-thread entry of the search pool: pure code only, so it runs as TS
// under tsx/vitest and bundled (scripts/build-search-worker.mjs) in production.
import { readlinkSync } from 'node:fs';
import os from 'node:os';
import { runSearchTask } from './runSearchTask';
import { fromWire, packHits, type PackedHits, type WireTask } from './taskWire';

// On Linux, lower this thread's scheduling priority (SEARCH_WORKER_NICE, default 5)
// so that when the cores are saturated the web server's event loop still gets
// its turn promptly; setpriority on a thread id affects that thread only.
try {
  const nice = Number(process.env.SEARCH_WORKER_NICE ?? 5);
  if (process.platform === 'linux' && Number.isInteger(nice) && nice > 0) {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (Number.isInteger(tid) && tid > 0) os.setPriority(tid, Math.min(19, nice));
  }
} catch {
  /* not permitted or not Linux: run at normal priority */
}

export default function searchWorker(task: WireTask): PackedHits {
  return packHits(runSearchTask(fromWire(task)));
}
