import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { sizeProblem } from '../lib/exchange/exchange-guards';
import { readAhead, readFileShared } from './shared-file-read';

const dir = mkdtempSync(join(tmpdir(), 'capstan-read-ahead-'));
const pause = () => new Promise((resolve) => setTimeout(resolve, 50));

describe('a file read ahead', () => {
  it('is what the command then reads: the bytes as they were when the read began', async () => {
    const path = join(dir, 'early.json');
    writeFileSync(path, '{"first": true}');
    readAhead(path);
    await pause();
    writeFileSync(path, '{"second": true}');
    expect((await readFileShared(path, sizeProblem)).toString('utf8')).toBe('{"first": true}');
    // Taken once: a second read reads the file again.
    expect((await readFileShared(path, sizeProblem)).toString('utf8')).toBe('{"second": true}');
  });

  it('of a file the exchange reader refuses by its size leaves the command its own read and message', async () => {
    const path = join(dir, 'empty.json');
    writeFileSync(path, '');
    readAhead(path);
    await expect(readFileShared(path, sizeProblem)).rejects.toThrow(
      `'${path}': The file is empty (0 bytes): nothing to import`
    );
    // A reader with no size rule (rank, which also reads the demo portfolio file) still gets the empty file.
    readAhead(path);
    expect((await readFileShared(path)).byteLength).toBe(0);
  });

  it('that failed leaves the message the command gives without it', async () => {
    const missing = join(dir, 'missing.json');
    readAhead(missing);
    readAhead(dir);
    await expect(readFileShared(missing, sizeProblem)).rejects.toThrow(
      `Cannot read '${missing}': no such file or not readable`
    );
    await expect(readFileShared(dir, sizeProblem)).rejects.toThrow(`'${dir}' is a folder, not a file`);
  });

  it('is checked against the reader’s own size rule before it is taken', async () => {
    const path = join(dir, 'small.json');
    writeFileSync(path, '{}');
    readAhead(path);
    await expect(
      readFileShared(path, (bytes) => (bytes > 1 ? `${bytes} bytes are too many here` : undefined))
    ).rejects.toThrow(`'${path}': 2 bytes are too many here`);
  });
});
