// Entry for `npm run bench` (after the build). Loads the TypeScript harness through tsx's loader;
// only plain modules and the built dist/ packages are imported, never Nest sources (tsx emits no
// decorator metadata): the api and workers run as child processes.
import { register } from 'tsx/esm/api';

register();
const { main } = await import('./main.ts');
process.exitCode = await main();
