// The one HTTP client: JSON in and out, cookies sent, the CSRF token attached to writes,
// and every error turned into an ApiError carrying the server's code, message and details.
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly details: unknown;
  constructor(status: number, code: string, message: string, details: unknown) {
    super(message);
    this.status = status;
    this.code = code;
    this.details = details;
  }
  /** field errors from a 400, keyed by dotted path */
  get fields(): Record<string, string> {
    const d = this.details as { fields?: { path: string; message: string }[] } | null;
    return Object.fromEntries((d?.fields ?? []).map((f) => [f.path, f.message]));
  }
}

let csrfToken: string | null = null;
export function setCsrfToken(token: string | null) {
  csrfToken = token;
}

async function parse(response: Response) {
  const text = await response.text();
  let body: unknown = null;
  if (text) {
    try {
      body = JSON.parse(text);
    } catch {
      body = text;
    }
  }
  if (!response.ok) {
    const e = (body as { error?: { code: string; message: string; details: unknown } } | null)?.error;
    throw new ApiError(response.status, e?.code ?? 'http-error', e?.message ?? `The server answered ${response.status}.`, e?.details ?? null);
  }
  return body;
}

export async function api<T>(path: string, options: { method?: string; body?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (options.body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;
  const response = await fetch(`/api${path}`, {
    method,
    headers,
    credentials: 'same-origin',
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    signal: options.signal,
  });
  return (await parse(response)) as T;
}

/** Multipart upload with progress (fetch has no upload progress; XHR does). */
export function uploadWithProgress<T>(path: string, form: FormData, onProgress: (fraction: number) => void): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api${path}`);
    xhr.withCredentials = true;
    xhr.setRequestHeader('Accept', 'application/json');
    if (csrfToken) xhr.setRequestHeader('X-CSRF-Token', csrfToken);
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress(event.loaded / event.total);
    };
    xhr.onload = () => {
      parse(new Response(xhr.responseText, { status: xhr.status })).then((b) => resolve(b as T), reject);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload could not reach the server.', null));
    xhr.send(form);
  });
}
