import { canonicalJson } from '../domain/canonical-json';
import { laterStamp } from '../domain/hybrid-clock';
import { countRecords, RECORD_KINDS, type RecordKind, type RecordsByKind } from '../domain/record-kinds';
import type { RecordMeta } from '../domain/record-meta';
import { changeSetProblem, recordPlace, restoreUnknownFields } from './change-set-checks';
import {
  duplicateKeyProblem,
  MAX_EXCHANGE_BYTES,
  MAX_RECORDS_PER_KIND,
  mb,
  pathText,
  printable,
  sizeProblem,
  walkStructure
} from './exchange-guards';
import { EXCHANGE_FORMAT_VERSIONS_READ, RESTORE_FROM } from './exchange-format-versions';
import { hostSchema, sha256Hex, writtenFactsElsewhere } from './exchange-host';
import {
  EXCHANGE_FORMAT,
  EXCHANGE_FORMAT_VERSION,
  exchangeFileSchema,
  type ExchangeHeader
} from './exchange-schema';
import { TAIL_LENGTH, writtenFileFacts, type WrittenFileFacts, type WrittenHash } from './written-file-facts';

/**
 * The exchange file, format version 1 (README, "Exchange file format"): one JSON object
 *
 *   { "format": "capstan-exchange", "formatVersion": 1, "header": {…}, "records": {…}, "sha256": "…" }
 *
 * written as canonical JSON (keys sorted, no white space, records of each kind in id order), optionally
 * gzip-compressed. `sha256` is the SHA-256 of the canonical text of everything else, so any change in transit is
 * detected — also after someone re-indents the file, since the reader recomputes the canonical text.
 */

/** What a file carries: the change set and who sent it. */
export interface ChangeSet {
  header: ExchangeHeader;
  records: RecordsByKind;
}

/**
 * Refusal of a file, with one line that says what is wrong and where. Nothing has been written. Control
 * characters that came from the file are shown as escapes, so the message is safe on any terminal.
 */
export class ExchangeFileError extends Error {
  constructor(message: string) {
    super(printable(message));
    this.name = 'ExchangeFileError';
  }
}

const GZIP_MAGIC = [0x1f, 0x8b];

/** Header fields the exporter supplies; counts and latest clock are filled in from the records. */
export type HeaderInput = Omit<ExchangeHeader, 'counts' | 'latestClock'>;

/** Builds a change set with counts and latest clock taken from its records. */
export function changeSetOf(header: HeaderInput, records: RecordsByKind): ChangeSet {
  let latestClock: string | undefined;
  for (const kind of RECORD_KINDS)
    for (const r of records[kind] as RecordMeta[]) latestClock = laterStamp(latestClock, r.clock);
  return {
    header: { ...header, counts: countRecords(records), ...(latestClock ? { latestClock } : {}) },
    records
  };
}

/**
 * Canonical bytes of a change set, hash included: the same change set always gives the same bytes. The body is
 * encoded to UTF-8 once; the hash is taken of those bytes and its key appended to them ("sha256" sorts after
 * every other top-level key, so the result is still the canonical form of the whole object).
 */
async function exchangeBytes(changeSet: ChangeSet): Promise<Uint8Array> {
  const text = canonicalJson({
    format: EXCHANGE_FORMAT,
    formatVersion: EXCHANGE_FORMAT_VERSION,
    header: changeSet.header,
    records: changeSet.records
  });
  const encoder = new TextEncoder();
  // Text of ASCII characters alone (as a company's usually is) is written straight into the file's buffer, with
  // room for the hash's key: one 300 MB buffer instead of the encoded body and a copy of it with the key, and
  // `encodeInto` took half the time of `encode` (Chromium, 114 MB). Other text is encoded whole, then copied.
  const room = new Uint8Array(text.length + TAIL_LENGTH - 1);
  const { read, written } = encoder.encodeInto(text, room);
  const ascii = read === text.length && written === text.length;
  const body = ascii ? room.subarray(0, text.length) : encoder.encode(text);
  const tail = encoder.encode(`,"sha256":"${await sha256Hex(body)}"}`);
  const out = ascii ? room : new Uint8Array(body.byteLength - 1 + tail.byteLength);
  if (!ascii) out.set(body.subarray(0, body.byteLength - 1));
  out.set(tail, body.byteLength - 1);
  return out;
}

/** The canonical text (what `exchangeBytes` encodes), for tests and tools that compare files as text. */
export async function exchangeText(changeSet: ChangeSet): Promise<string> {
  return new TextDecoder().decode(await exchangeBytes(changeSet));
}

const unpacksTooLarge = (limit: number) =>
  `The compressed file unpacks to more than ${mb(limit)}; Capstan reads exchange files up to that size`;

async function pipeBytes(
  bytes: Uint8Array,
  transform: CompressionStream | DecompressionStream,
  limit: number
) {
  const stream = new Blob([bytes as BlobPart]).stream().pipeThrough(transform);
  const reader = stream.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel();
      throw new ExchangeFileError(unpacksTooLarge(limit));
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/**
 * The file's bytes: UTF-8 canonical JSON, gzip-compressed when asked. Throws ExchangeFileError, before anything
 * is written, when the text is larger than a device reads (`maxBytes`, MAX_EXCHANGE_BYTES unless a test asks
 * for less): a file no device can read would pass for a sent one.
 */
export async function encodeExchangeFile(
  changeSet: ChangeSet,
  options: { gzip?: boolean; maxBytes?: number } = {}
): Promise<Uint8Array> {
  const bytes = await exchangeBytes(changeSet);
  const limit = options.maxBytes ?? MAX_EXCHANGE_BYTES;
  if (bytes.byteLength > limit)
    throw new ExchangeFileError(
      `This file would hold ${mb(bytes.byteLength)} of records, more than the ${mb(limit)} Capstan reads: nothing was written — export per site, or as changes since the last file, instead`
    );
  return options.gzip ? pipeBytes(bytes, new CompressionStream('gzip'), Number.MAX_SAFE_INTEGER) : bytes;
}

/** Two lines that split into the same number (> 1) of cells by one separator: a delimited table. */
function looksLikeCsv(text: string): boolean {
  const lines = text
    .slice(0, 4000)
    .split(/\r?\n/)
    .filter((l) => l.trim() !== '')
    .slice(0, 2);
  if (lines.length < 2) return false;
  return [',', ';', '\t'].some((sep) => {
    const cells = lines.map((l) => l.split(sep).length);
    return cells[0]! > 1 && cells[0] === cells[1];
  });
}

function jsonProblem(text: string, error: unknown): string {
  const detail = error instanceof Error ? error.message : String(error);
  if (/end of (JSON )?input|Unterminated string|Unexpected end/i.test(detail)) {
    return `The file ends early — it was probably cut off in transit (${detail})`;
  }
  if (/NaN|Infinity/.test(detail) || /[:,[]\s*-?(NaN|Infinity)\b/.test(text.slice(0, 1_000_000))) {
    return `The file is not valid JSON: it holds NaN or Infinity, which JSON cannot carry (${detail})`;
  }
  return `The file is not valid JSON (${detail})`;
}

/**
 * Reads and checks a whole file, in this order: size, compression, text encoding, JSON, structure (depth,
 * forbidden keys, list lengths), keys written twice, format and version, content hash, schema, unknown fields
 * kept, bookkeeping, time stamps against this device's clock (`nowMs`), duplicate ids, counts, one live study
 * per month. Returns the change set or throws an ExchangeFileError with one line. Never writes anything.
 */
export type DecodeStage = 'unpacking' | 'parsing' | 'verifying';

export async function decodeExchangeFile(
  input: Uint8Array,
  onStage: (stage: DecodeStage) => void = () => undefined,
  nowMs: number = Date.now()
): Promise<ChangeSet> {
  const tooBig = sizeProblem(input.byteLength);
  if (tooBig) throw new ExchangeFileError(tooBig);
  let bytes = input;
  if (bytes[0] === GZIP_MAGIC[0] && bytes[1] === GZIP_MAGIC[1]) {
    onStage('unpacking');
    // A gzip file ends with its (last part's) unpacked size modulo 2³² (RFC 1952, ISIZE): never more than the
    // whole, so a size over the bound refuses the file at once, without unpacking 512 MB first. The bound on
    // the bytes unpacked below stays the guarantee (a size past 4 GB wraps round).
    if (bytes.byteLength >= 18) {
      const end = bytes.byteLength;
      const unpacked =
        (bytes[end - 4]! | (bytes[end - 3]! << 8) | (bytes[end - 2]! << 16) | (bytes[end - 1]! << 24)) >>> 0;
      if (unpacked > MAX_EXCHANGE_BYTES) throw new ExchangeFileError(unpacksTooLarge(MAX_EXCHANGE_BYTES));
    }
    try {
      bytes = await pipeBytes(bytes, new DecompressionStream('gzip'), MAX_EXCHANGE_BYTES);
    } catch (e) {
      if (e instanceof ExchangeFileError) throw e;
      throw new ExchangeFileError(
        'The file is gzip-compressed but damaged or cut off: it cannot be unpacked'
      );
    }
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw new ExchangeFileError(
      'The file is not UTF-8 text: it is not a Capstan exchange file (or it is damaged)'
    );
  }
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.trim() === '') throw new ExchangeFileError('The file holds only white space: nothing to import');
  if (!text.trimStart().startsWith('{')) {
    throw new ExchangeFileError(
      looksLikeCsv(text)
        ? 'This looks like a CSV table, not a Capstan exchange file — measurements from a spreadsheet are imported on the Log page'
        : 'The file is not a Capstan exchange file: it does not start with a JSON object'
    );
  }
  onStage('parsing');
  // Asked for before this thread parses: another thread, or Web Crypto, works meanwhile.
  const elsewhere = writtenFactsElsewhere(bytes)?.catch(() => undefined);
  const facts = elsewhere
    ? elsewhere.then((f) => f ?? writtenFileFacts(text, bytes))
    : writtenFileFacts(text, bytes);
  facts.catch(() => undefined); // not waited for when the text is not JSON
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new ExchangeFileError(jsonProblem(text, e));
  }
  onStage('verifying');
  return checkParsed(parsed, text, nowMs, facts);
}

/** Path of a schema problem, naming the record (kind, index and id) when it lies inside one. */
function problemPlace(parsed: unknown, path: readonly (string | number)[]): string {
  if (path[0] === 'records' && typeof path[1] === 'string' && typeof path[2] === 'number') {
    const kind = path[1] as RecordKind;
    const raw = (parsed as { records: Record<string, { id?: unknown }[]> }).records[kind]?.[path[2]];
    const field = path.slice(3);
    return `${recordPlace(kind, path[2], raw?.id)}${field.length ? `, ${pathText(field)}` : ''}`;
  }
  return pathText(path);
}

/** The envelope: what the file says it is (format and version) and that it carries a content hash. */
function envelopeProblem(top: Record<string, unknown>): string | undefined {
  if (top.kind === 'capstan-demo-portfolio') {
    return 'This is the demo portfolio file, not an exchange file — load the demo from the start page';
  }
  if (top.format !== EXCHANGE_FORMAT) {
    return `The file is JSON but not a Capstan exchange file ("format" is not "${EXCHANGE_FORMAT}")`;
  }
  if (typeof top.formatVersion !== 'number' || !Number.isInteger(top.formatVersion)) {
    return 'formatVersion must be a whole number: the file is damaged or was edited by hand';
  }
  if (top.formatVersion > EXCHANGE_FORMAT_VERSION) {
    return `The file has format version ${top.formatVersion}, made by a newer Capstan; this app reads version ${EXCHANGE_FORMAT_VERSION} — update the app, then import it`;
  }
  if (!RESTORE_FROM[top.formatVersion]) {
    return `Format version ${top.formatVersion} is not one Capstan ever wrote (this app reads ${EXCHANGE_FORMAT_VERSIONS_READ.join(', ')})`;
  }
  if (typeof top.sha256 !== 'string' || !/^[0-9a-f]{64}$/.test(top.sha256)) {
    return 'The file has no valid content hash (sha256): it is damaged or was edited by hand';
  }
  return undefined;
}

function refuse(problem: string | undefined): void {
  if (problem) throw new ExchangeFileError(problem);
}

const HASH_MISMATCH =
  'The content hash does not match: the file was changed or damaged after it was exported';

/**
 * The hash check of a file whose `sha256` is well formed: undefined when it matches, else the line refusing the
 * file. A file exactly as written is judged by the digest of its bytes; a rewritten one in canonical form.
 */
async function hashProblem(
  top: Record<string, unknown>,
  sha256: string,
  written: WrittenHash | undefined
): Promise<string | undefined> {
  if (written?.claimed === sha256 && written.digest === sha256) return undefined;
  let body: string;
  try {
    const { sha256: _hash, ...rest } = top;
    body = canonicalJson(rest, 64);
  } catch (e) {
    return e instanceof Error ? e.message : String(e);
  }
  return (await sha256Hex(body)) === sha256 ? undefined : HASH_MISMATCH;
}

/** The checks after parsing, each refusing the file with one line, in the order decodeExchangeFile gives. */
async function checkParsed(
  parsed: unknown,
  text: string,
  nowMs: number,
  facts: Promise<WrittenFileFacts>
): Promise<ChangeSet> {
  const walk = walkStructure(parsed, MAX_RECORDS_PER_KIND);
  refuse(walk.problem);
  const { keysWritten, written } = await facts;
  refuse(duplicateKeyProblem(text, walk.keys, keysWritten));
  const top = parsed as Record<string, unknown>;
  refuse(envelopeProblem(top));
  // A rewritten file's canonical form is hashed while the schema is checked (in the browser, off this thread).
  // The schema's verdict is given only once the hash has been found to match: a damaged file is named first.
  const hash = hashProblem(top, top.sha256 as string, written);
  const restore = RESTORE_FROM[top.formatVersion as number]!;
  const result = hostSchema(exchangeFileSchema).safeParse(restore(top));
  refuse(await hash);
  if (!result.success) {
    const issues = result.error.issues;
    const first = issues[0]!;
    const more =
      issues.length > 1 ? ` (and ${issues.length - 1} more problem${issues.length > 2 ? 's' : ''})` : '';
    refuse(`${problemPlace(parsed, first.path as (string | number)[])}: ${first.message}${more}`);
  }
  const { header, records } = result.data as unknown as ChangeSet;
  refuse(restoreUnknownFields(parsed, records) ?? changeSetProblem(header, records, nowMs));
  return { header, records };
}

/** Suggested file name: who, what and when, safe on every file system. */
export function exchangeFileName(header: ExchangeHeader, gzip: boolean): string {
  const who =
    (header.exportedBy.deviceName || 'device').replace(/[^A-Za-z0-9-]+/g, '-').slice(0, 40) || 'device';
  const what =
    header.scope.kind === 'site'
      ? `site-${header.scope.siteName.replace(/[^A-Za-z0-9-]+/g, '-').slice(0, 40)}`
      : header.scope.kind === 'changes'
        ? `changes-for-${header.scope.recipient.name.replace(/[^A-Za-z0-9-]+/g, '-').slice(0, 40)}`
        : header.scope.kind;
  const when = header.exportedAt.slice(0, 19).replace(/[:T]/g, '-');
  return `capstan-${who}-${what}-${when}.capstan.json${gzip ? '.gz' : ''}`;
}
