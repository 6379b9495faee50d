/** Entry point of `npm run -s cli -- …`. */
import { runCli } from './run-cli';

const code = await runCli(process.argv.slice(2), {
  stdout: (text) => process.stdout.write(`${text}\n`),
  stderr: (text) => process.stderr.write(`${text}\n`)
});
process.exitCode = code;
