/** Entry point of `npm run -s cli -- …` (compiled by src/build/cli.mjs). */
import { useExchangeHost } from '../lib/exchange/exchange-host';
import { FAST_EXCHANGE_HOST } from './fast-exchange-host';
import { runCli } from './run-cli';

// A reader that stops early (`… | head`) closes the pipe: that is not an error, so stop quietly, as Unix tools do.
process.stdout.on('error', (error: NodeJS.ErrnoException) => {
  if (error.code === 'EPIPE') process.exit(0);
  throw error;
});

useExchangeHost(FAST_EXCHANGE_HOST);

const code = await runCli(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(`${text}\n`),
  stderr: (text) => process.stderr.write(`${text}\n`)
});
process.exitCode = code;
