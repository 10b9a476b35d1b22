/**
 * A chunk that will not load. Before the service worker holds the app, a visitor mid-visit during a deploy
 * asks for chunks of the build their page started with, which the server no longer has (their names carry
 * a content hash). When the server's page now names another entry script, the app reloads once to that
 * build; the person's session is kept (localStorage), so they land where they were going. Otherwise
 * (offline, the server away, or the same build) the failure stands with a plain message, and the error
 * screen's "Try again" asks for the chunk again.
 */

/** Whether an `import()` or the shared chunk failed to arrive (not a module that threw as it ran). */
export function isChunkLoadFailure(err: unknown): boolean {
  const name = (err as { name?: unknown } | null)?.name;
  // Metro's import() (expo/src/async-require/fetchThenEval.web.ts) and load-shared.web.ts.
  return name === 'AsyncRequireError' || name === 'ChunkLoadError';
}

/** The message shown when a page's code could not be loaded. */
export const CHUNK_FAILED_MESSAGE =
  'Pivotwatch could not load this page. Check the connection and try again.';

/** sessionStorage: the entry script the page last reloaded for, so a build that keeps failing reloads once. */
const RELOADED_FOR = 'pivotwatch.reloaded-for-build';

/** The entry script's address in a page (`/_expo/static/js/web/entry-<hash>.js`). */
export function entryScriptOf(html: string): string | null {
  return /<script[^>]*\ssrc="([^"]*\/entry-[^"]+)"/.exec(html)?.[1] ?? null;
}

function runningEntry(): string | null {
  return document.querySelector('script[src*="/entry-"]')?.getAttribute('src') ?? null;
}

async function servedEntry(): Promise<string | null> {
  try {
    const res = await fetch('/', { cache: 'no-store', headers: { Accept: 'text/html' } });
    return res.ok ? entryScriptOf(await res.text()) : null;
  } catch {
    return null;
  }
}

let checking: Promise<never> | null = null;

/**
 * After a chunk failed to load: reloads to the server's newer build (once per build; the promise then
 * never settles, the page is going), or rejects with the plain message.
 */
export function afterChunkFailure(): Promise<never> {
  checking ??= (async (): Promise<never> => {
    const served = await servedEntry();
    const running = runningEntry();
    if (served && running && served !== running && sessionStorage.getItem(RELOADED_FOR) !== served) {
      sessionStorage.setItem(RELOADED_FOR, served);
      window.location.reload();
      return new Promise<never>(() => undefined);
    }
    checking = null;
    throw new Error(CHUNK_FAILED_MESSAGE);
  })();
  return checking;
}
