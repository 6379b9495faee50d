/** Entry point of `npm run -s cli -- …` (compiled by src/build/cli.mjs). */
import { useExchangeHost } from '../lib/exchange/exchange-host';
import { EXCHANGE_COMMANDS, runCli } from './run-cli';

// A reader that stops early (`… | head`) closes the pipe: that is not an error, so stop quietly, as Unix tools do.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

const argv = process.argv.slice(2);
// Loaded only for the commands that use it: it loads zod, which the usage text does not need.
if (EXCHANGE_COMMANDS.has(argv[0] ?? ''))
  useExchangeHost((await import('./fast-exchange-host')).FAST_EXCHANGE_HOST);

const code = await runCli(argv, {
  stdout: (text) => process.stdout.write(`${text}\n`),
  stderr: (text) => process.stderr.write(`${text}\n`)
});
process.exitCode = code;
