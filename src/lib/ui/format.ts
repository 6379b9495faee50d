/** Display formatting shared by the pages; one place so every page writes numbers the same way. */

const integer = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });

export function formatCount(value: number): string {
  return integer.format(value);
}

export function formatMoney(value: number, currency: string): string {
  try {
    return new Intl.NumberFormat(undefined, { style: 'currency', currency, maximumFractionDigits: 0 }).format(
      value
    );
  } catch {
    return `${integer.format(value)} ${currency}`;
  }
}

export function formatBytes(bytes: number | undefined): string {
  if (bytes === undefined) return 'unknown';
  const units = ['B', 'KB', 'MB', 'GB', 'TB'];
  let v = bytes;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u += 1;
  }
  return `${v.toFixed(u === 0 ? 0 : 1)} ${units[u]}`;
}

/** A limit or target, or an en dash where there is none. */
export function formatLimit(value: number | undefined): string {
  return value === undefined ? '–' : String(value);
}

export function formatDateTime(iso: string): string {
  return new Date(iso).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' });
}
