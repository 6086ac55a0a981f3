// Run first by `npm test`: without Chromium the suite would fail only at its end-to-end part, many
// minutes in. One line saying what to install, and a non-zero exit.
import { findChromium } from './chromium';

const chromium = findChromium();
if (!chromium.found) {
  console.error(chromium.problem);
  process.exit(1);
}
