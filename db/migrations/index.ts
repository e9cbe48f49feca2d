// The migration history, in order. Add a file and list it here; never edit a
// migration that has shipped.
import * as m0001 from './0001-schema';
import * as m0002 from './0002-auth';

export const migrations = [
  { name: '0001-schema', ...m0001 },
  { name: '0002-auth', ...m0002 },
];
