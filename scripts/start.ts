// `npm start`: Crosswatt with demo data at http://127.0.0.1:3000, on its own
// PostgreSQL unless DATABASE_URL is set; the client is built when stale.
import { buildClientIfStale } from './lib/client-build';
import { runCrosswatt } from './lib/run-crosswatt';

runCrosswatt({ beforeServer: () => buildClientIfStale() });
