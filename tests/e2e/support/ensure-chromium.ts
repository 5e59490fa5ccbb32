// Global setup of the e2e project: Debian's Chromium must exist before any browser
// test starts (installed when run as root, otherwise one clear error with the command).
import { ensureChromium } from '../../../scripts/lib/chromium';

export default function setup() {
  ensureChromium();
}
