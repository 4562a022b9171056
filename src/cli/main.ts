/** The `eigenframe` binary's entry (built to dist/cli.cjs). */
import { main } from './run';

main();
