// Where Debian's Chromium lives and how we start it headless on a machine with no outside network.
// The networking flags stop Chromium's own background requests (updates, sync, safe browsing).
export const chromiumPath: string = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export const chromiumArgs: string[] = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
  '--disable-default-apps',
  '--disable-extensions',
  '--mute-audio',
];
