/**
 * A stand-in for the Pivotwatch API in app tests: `global.fetch` answers from the test's own routes and
 * keeps a record of every request, so a test checks both what the screen asked for and what it did with
 * the answer. Installed with `jest.spyOn`, so the test file's `jest.restoreAllMocks()` takes it away.
 */

/** One request as the app sent it: the body is parsed back from JSON (bytes stay bytes). */
export type StandInCall = {
  method: string;
  url: URL;
  path: string;
  search: URLSearchParams;
  headers: Record<string, string>;
  body: unknown;
};

/** An answer: a status and a JSON body (`body` left out answers with no body at all). */
export type StandInReply = { status: number; body?: unknown };

/** A route answers a request, or returns undefined to leave it to the fallback (a 404). */
export type StandInRoute = (
  call: StandInCall,
) => StandInReply | undefined | Promise<StandInReply | undefined>;

/** Routes by exact path, or one function that sees every request. */
export type StandInRoutes = Record<string, StandInRoute> | StandInRoute;

export type StandInApi = {
  /** Every request so far, oldest first. */
  calls: StandInCall[];
  callsTo: (method: string, path: string) => StandInCall[];
};

/** What an unknown path gets, in the API's error shape. */
export const notFound = (message = 'No such route'): StandInReply => ({
  status: 404,
  body: { error: { code: 'not_found', message } },
});

export const ok = (body: unknown): StandInReply => ({ status: 200, body });

function bodyOf(raw: unknown): unknown {
  if (typeof raw === 'string') return JSON.parse(raw);
  if (raw instanceof ArrayBuffer) return new Uint8Array(raw);
  return raw ?? undefined;
}

function asResponse(reply: StandInReply): Response {
  return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), {
    status: reply.status,
    headers: { 'Content-Type': 'application/json' },
  });
}

/**
 * Answers `fetch` from `routes` (a function, or paths mapped to functions) until the mocks are restored.
 * Anything no route answers gets `fallback` (a 404 in the API's error shape unless the test says).
 */
export function standInApi(routes: StandInRoutes, fallback: StandInReply = notFound()): StandInApi {
  const calls: StandInCall[] = [];
  const route: StandInRoute =
    typeof routes === 'function'
      ? routes
      : (call) => (routes[call.path] ? routes[call.path](call) : undefined);
  jest.spyOn(global, 'fetch').mockImplementation(async (input, init) => {
    // The app asks for paths of its own origin; the host here is only there to parse them.
    const url = new URL(String(input), 'http://pivotwatch.test');
    const call: StandInCall = {
      method: init?.method ?? 'GET',
      url,
      path: url.pathname,
      search: url.searchParams,
      headers: (init?.headers ?? {}) as Record<string, string>,
      body: bodyOf(init?.body),
    };
    calls.push(call);
    return asResponse((await route(call)) ?? fallback);
  });
  return {
    calls,
    callsTo: (method, path) => calls.filter((c) => c.method === method && c.path === path),
  };
}

/** No signal: every request fails the way fetch fails when the server cannot be reached. */
export function noSignal(message = 'Network request failed') {
  jest.spyOn(global, 'fetch').mockRejectedValue(new TypeError(message));
}
