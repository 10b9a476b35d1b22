// globalSetup runs outside jest's module mapper, so no @/ alias here.
import { buildWeb } from '../../scripts/build-web';

/** Builds the web export once for all browser tests (skipped when dist/ is up to date). */
export default async function globalSetup() {
  await buildWeb();
}
