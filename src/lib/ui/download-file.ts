/** Offers a blob as a file download; works offline (an object URL, no network). */
export function downloadBlob(filename: string, blob: Blob): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

/** Text (a CSV table) as a download. */
export function downloadText(filename: string, text: string, type = 'text/csv;charset=utf-8'): void {
  downloadBlob(filename, new Blob([text], { type }));
}

/** Bytes (an exchange file) as a download. */
export function downloadBytes(filename: string, bytes: Uint8Array, type: string): void {
  downloadBlob(filename, new Blob([bytes as BlobPart], { type }));
}
