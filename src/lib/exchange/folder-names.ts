/**
 * Which names in a shared sync folder are exchange files to read. One home for the rule, so that the app's
 * folder transport and the command line's `gather` skip and read the same files.
 *
 * - Unfinished names are skipped: files a sync service or a browser is still writing under a temporary name.
 *   Syncthing writes `.syncthing.NAME.tmp` (`~syncthing~NAME.tmp` on Windows), Chromium's file access writes
 *   `NAME.crswap`, Resilio `NAME.!sync`, browsers and many tools `.part`, `.partial`, `.crdownload`, `.tmp`;
 *   Capstan itself writes `.NAME.tmp` and renames it when complete. Hidden names (a leading dot) and Office-style
 *   lock files (`~$NAME`) are skipped too. (These patterns are the services' documented or observed habits,
 *   gathered from their manuals and common practice, not a standard.)
 * - A sync service's conflict copy keeps most of the original name: Syncthing inserts `.sync-conflict-…`
 *   before the last extension, other services add "(conflicted copy …)", "(1)" or a machine name. So an
 *   exchange file is any other name that contains `.capstan` and ends in `.json` or `.gz`; its content decides
 *   the rest (a damaged one is named and skipped, never fatal).
 */
export type FolderEntryRole = 'exchange' | 'unfinished' | 'other';

const UNFINISHED_ENDINGS = [
  '.tmp',
  '.temp',
  '.part',
  '.partial',
  '.crdownload',
  '.download',
  '.crswap',
  '.!sync'
];

export function folderEntryRole(name: string): FolderEntryRole {
  const lower = name.toLowerCase();
  if (lower.startsWith('.') || lower.startsWith('~')) return 'unfinished';
  if (UNFINISHED_ENDINGS.some((end) => lower.endsWith(end))) return 'unfinished';
  if (lower.includes('.capstan') && (lower.endsWith('.json') || lower.endsWith('.gz'))) return 'exchange';
  return 'other';
}

/**
 * The exchange files among a folder's file names, in code-unit order: every reader takes them in this order,
 * so what the folder lists first never matters.
 */
export function exchangeNamesIn(fileNames: Iterable<string>): string[] {
  return [...fileNames]
    .filter((name) => folderEntryRole(name) === 'exchange')
    .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
}

/** The name a file is written under while it is incomplete: hidden and `.tmp`, so every reader skips it. */
export function unfinishedNameOf(finalName: string): string {
  return `.${finalName}.tmp`;
}

/**
 * This device's own file in a shared folder: its name (as set in Settings) and the start of its id, so two
 * devices named alike never write the same file, and the name stays the same from one sync to the next.
 */
export function deviceFileName(deviceName: string, deviceId: string): string {
  const who =
    deviceName
      .replace(/[^A-Za-z0-9-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 40) || 'device';
  const id = deviceId.replace(/[^A-Za-z0-9]+/g, '').slice(0, 8) || 'unknown';
  return `${who}-${id}.capstan.json.gz`;
}
