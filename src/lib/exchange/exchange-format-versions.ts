/**
 * Reading older format versions: each version Capstan ever wrote maps to a function that turns a file of that
 * version (after its hash is checked) into the current shape — fill defaults, rename, move — before the schema
 * validates it; fields a newer version adds to records are kept by `restoreUnknownFields`. Version 1 is the
 * current one, so it is read as it is. A new version adds its entry here and a fixture file under
 * tests/fixtures/exchange-format/.
 */
export const RESTORE_FROM: Readonly<Record<number, (file: Record<string, unknown>) => unknown>> = {
  1: (file) => file
};

export const EXCHANGE_FORMAT_VERSIONS_READ = Object.keys(RESTORE_FROM).map(Number);
