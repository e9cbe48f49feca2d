// What a server process starts once, in the background, on its first request:
// the in-memory search index (loaded from MariaDB, then kept current by
// polling the library version) and other long-lived services. /api/health
// answers "ok" only once this is ready.
type Step = () => Promise<void>;

interface RuntimeState {
  started: boolean;
  ready: boolean;
  error: string | null;
  steps: { name: string; run: Step }[];
  promise: Promise<void> | null;
}

const state: RuntimeState = { started: false, ready: false, error: null, steps: [], promise: null };

/** Register a start-up step (called at module load by the modules that own them). */
export function registerStartupStep(name: string, run: Step): void {
  if (!state.steps.some((s) => s.name === name)) state.steps.push({ name, run });
}

export function ensureRuntime(): Promise<void> {
  if (!state.promise) {
    state.started = true;
    state.promise = (async () => {
      for (const step of state.steps) {
        for (let attempt = 0; ; attempt++) {
          try {
            await step.run();
            break;
          } catch (e) {
            state.error = `${step.name}: ${(e as Error).message}`;
            // The database may not be up yet: keep trying, never crash the process.
            await new Promise((r) => setTimeout(r, Math.min(5000, 250 * 2 ** attempt)));
          }
        }
      }
      state.error = null;
      state.ready = true;
    })();
  }
  return state.promise;
}

export function runtimeStatus() {
  return { ready: state.ready, error: state.error };
}
