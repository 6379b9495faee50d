/** Where the command line writes: real streams in main.ts, captured strings in tests. */
export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
}
