/** Entry point of `npm run -s cli -- …` (compiled by src/build/cli.mjs). */
import { useExchangeHost } from '../lib/exchange/exchange-host';
import { EXCHANGE_COMMANDS, FILE_FIRST_COMMANDS, runCli } from './run-cli';
import { readAhead } from './shared-file-read';
import { writtenFactsThread } from './written-facts-thread';

// A reader that stops early (`… | head`) closes the pipe: that is not an error, so stop quietly, as Unix tools do.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

const argv = process.argv.slice(2);
// The file a command reads first is read while the rest loads (shared-file-read.ts). The exchange host is loaded
// only for the commands that use it: it loads zod, which the usage text does not need. The written facts' thread
// is started before it, so that it starts up while zod loads and the file is read; it is the compiled worker
// beside this file (src/build/cli.mjs builds both).
const [command, first] = argv;
if (FILE_FIRST_COMMANDS.has(command ?? '') && first !== undefined && !first.startsWith('-')) readAhead(first);
if (EXCHANGE_COMMANDS.has(command ?? '')) {
  const writtenFacts = writtenFactsThread(new URL('./written-facts-worker.js', import.meta.url));
  useExchangeHost({ ...(await import('./fast-exchange-host')).FAST_EXCHANGE_HOST, writtenFacts });
}

const code = await runCli(argv, {
  stdout: (text) => process.stdout.write(`${text}\n`),
  stderr: (text) => process.stderr.write(`${text}\n`)
});
process.exitCode = code;
