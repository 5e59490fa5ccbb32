// `npm start` for the stop tests: the same launcher (node --import tsx) and runner,
// without the client build and the demo seed, which only take time here.
import { runCrosswatt } from '../../../scripts/lib/run-crosswatt';

runCrosswatt({ seedDemo: false });
