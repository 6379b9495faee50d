import { openAsBlob } from 'node:fs';
import { readdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import { basename, join } from 'node:path';
import type { SyncDirectory, SyncFileHandle } from '../../src/lib/exchange/folder-sync';

/**
 * A directory on disk behind the same few methods as the browser's FileSystemDirectoryHandle, so the app's
 * folder transport can be handed a real folder in Node (a folder a real sync engine fills, in the tests).
 * Writing goes to the named file when the writer closes; `move` is a rename, as in Chromium.
 */
export function nodeDirectoryHandle(path: string): SyncDirectory {
  const fileHandle = (name: string): SyncFileHandle => {
    let current = name;
    return {
      get name() {
        return current;
      },
      async getFile() {
        const full = join(path, current);
        const info = await stat(full);
        const blob = await openAsBlob(full);
        return Object.assign(blob, { lastModified: Math.floor(info.mtimeMs) });
      },
      async createWritable() {
        const chunks: Uint8Array[] = [];
        return {
          async write(data: Uint8Array | Blob) {
            chunks.push(
              data instanceof Blob ? new Uint8Array(await data.arrayBuffer()) : new Uint8Array(data)
            );
          },
          async close() {
            await writeFile(join(path, current), Buffer.concat(chunks));
          }
        };
      },
      async move(newName: string) {
        await rename(join(path, current), join(path, basename(newName)));
        current = basename(newName);
      }
    };
  };
  return {
    name: basename(path),
    async *values() {
      for (const entry of await readdir(path, { withFileTypes: true })) {
        yield { kind: entry.isDirectory() ? ('directory' as const) : ('file' as const), name: entry.name };
      }
    },
    async getFileHandle(name, options) {
      const full = join(path, name);
      const exists = await stat(full).then(
        (s) => s.isFile(),
        () => false
      );
      if (!exists) {
        if (!options?.create) throw new DOMException(`${name} not found`, 'NotFoundError');
        await writeFile(full, new Uint8Array());
      }
      return fileHandle(name);
    },
    async removeEntry(name) {
      await rm(join(path, name));
    }
  };
}
