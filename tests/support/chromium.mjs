/**
 * How every browser check here starts Debian's Chromium: Playwright's own browser download cannot work on these
 * machines. Without the background-networking flags Chromium keeps dialling out on a machine with no network.
 */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync'
];
