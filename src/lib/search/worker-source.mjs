// Loads the TypeScript worker through tsx, for vitest and tsx-run scripts,
// where no bundled dist/search-worker.mjs is needed.
import { register } from 'tsx/esm/api';

register();
const mod = await import('./worker.ts');
export default mod.default;
