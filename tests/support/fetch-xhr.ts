/**
 * The browser's XMLHttpRequest, as far as the app's photo upload uses it, over node's fetch: node has no
 * XMLHttpRequest, and the upload goes around the JSON client to report progress. It stands in for the
 * platform, not for our code: a request that fails or is cut (even mid-answer) fires `onerror`, one past
 * `timeout` fires `ontimeout`, any answer fires `onload` with its status and text. Progress is not
 * reported (fetch has no upload progress); the upload does not depend on it.
 */
export class FetchXmlHttpRequest {
  status = 0;
  responseText = '';
  timeout = 0;
  upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } =
    { onprogress: null };
  onload: (() => void) | null = null;
  onerror: (() => void) | null = null;
  ontimeout: (() => void) | null = null;
  onabort: (() => void) | null = null;
  private method = 'GET';
  private url = '';
  private readonly headers: Record<string, string> = {};

  open(method: string, url: string) {
    this.method = method;
    this.url = url;
  }

  setRequestHeader(name: string, value: string) {
    this.headers[name] = value;
  }

  send(body?: ArrayBuffer | string | null) {
    const signal = this.timeout > 0 ? AbortSignal.timeout(this.timeout) : undefined;
    fetch(this.url, { method: this.method, headers: this.headers, body: body ?? undefined, signal })
      .then(async (res) => {
        const text = await res.text();
        this.status = res.status;
        this.responseText = text;
        this.onload?.();
      })
      .catch((err: unknown) => {
        if (err instanceof Error && err.name === 'TimeoutError') this.ontimeout?.();
        else this.onerror?.();
      });
  }
}
