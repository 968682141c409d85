// Debian's Chromium for the browser journeys (never a browser download: the machines reach only the
// package registries).
import { existsSync } from 'node:fs';
import { aptInstall } from './run.mjs';

export const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

export function ensureChromium() {
  if (!existsSync(CHROMIUM)) aptInstall(['chromium'], 'Chromium is needed for the browser journeys.');
  return CHROMIUM;
}
