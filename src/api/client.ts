// The one fetch wrapper of the client: base '/api', bearer token, the server's error shape, 401 handled in one place.

/** Where the session token lives between page loads. */
export const TOKEN_STORAGE_KEY = 'gapsight.token';

/** Field path → what is wrong with it, as the server names them (`"shots.0.durationS": "must be above zero"`). */
export type FieldErrors = Record<string, string>;

/** An answer other than 2xx, or no answer at all (status 0), turned into one error the pages can show. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: FieldErrors | undefined;
  /** Seconds to wait before trying again, from a 429's `Retry-After` header. */
  readonly retryAfterS: number | undefined;

  constructor(status: number, code: string, message: string, fields?: FieldErrors, retryAfterS?: number) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.retryAfterS = retryAfterS;
  }
}

// Read the stored token (null when signed out or when storage is unavailable).
export function readStoredToken(): string | null {
  try {
    return globalThis.localStorage?.getItem(TOKEN_STORAGE_KEY) ?? null;
  } catch {
    return null;
  }
}

// Store or forget the token; the session store is the only caller.
export function writeStoredToken(token: string | null): void {
  try {
    if (token) globalThis.localStorage?.setItem(TOKEN_STORAGE_KEY, token);
    else globalThis.localStorage?.removeItem(TOKEN_STORAGE_KEY);
  } catch {
    // Private mode or storage disabled: the session then lasts as long as the tab.
  }
}

/** Turn anything thrown into an ApiError a page can show. */
export function toApiError(error: unknown): ApiError {
  return error instanceof ApiError ? error : new ApiError(0, 'client_error', error instanceof Error ? error.message : String(error));
}

/** Whether a caught error is the abort of a request we cancelled ourselves. */
export function isAbort(error: unknown, signal?: AbortSignal): boolean {
  return !!signal?.aborted || (error instanceof DOMException && error.name === 'AbortError') || (error instanceof Error && error.name === 'AbortError');
}

type UnauthorizedHandler = (error: ApiError) => void;
let unauthorizedHandler: UnauthorizedHandler | null = null;

// Register what happens when the server rejects our token (the router clears the session and goes to sign-in).
export function setUnauthorizedHandler(handler: UnauthorizedHandler | null): void {
  unauthorizedHandler = handler;
}

export type QueryValue = string | number | boolean | null | undefined;

export interface RequestOptions {
  /** JSON-serialisable body, or FormData for uploads. */
  body?: unknown;
  /** Added to the URL; null/undefined/'' values are left out. */
  query?: Record<string, QueryValue>;
  /** false for the routes that need no sign-in (health, login): no token is sent. */
  auth?: boolean;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

const API_BASE = '/api';

function buildUrl(path: string, query?: Record<string, QueryValue>): string {
  const url = API_BASE + (path.startsWith('/') ? path : `/${path}`);
  if (!query) return url;
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query)) {
    if (value === null || value === undefined || value === '') continue;
    params.append(key, String(value));
  }
  const search = params.toString();
  return search ? `${url}?${search}` : url;
}

function isErrorBody(value: unknown): value is { error: { code?: unknown; message?: unknown; fields?: unknown } } {
  return typeof value === 'object' && value !== null && typeof (value as { error?: unknown }).error === 'object'
    && (value as { error?: unknown }).error !== null;
}

async function errorFromResponse(response: Response): Promise<ApiError> {
  const retryHeader = response.headers.get('Retry-After');
  const retryAfterS = retryHeader !== null && /^\d+$/.test(retryHeader.trim()) ? Number(retryHeader) : undefined;
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // Not JSON (a proxy's HTML page, an empty body): fall back to the status line below.
  }
  if (isErrorBody(body)) {
    const { code, message, fields } = body.error;
    return new ApiError(
      response.status,
      typeof code === 'string' ? code : 'http_error',
      typeof message === 'string' && message ? message : `The server answered ${response.status}.`,
      typeof fields === 'object' && fields !== null ? (fields as FieldErrors) : undefined,
      retryAfterS,
    );
  }
  return new ApiError(
    response.status,
    'http_error',
    `The server answered ${response.status}${response.statusText ? ` ${response.statusText}` : ''}.`,
    undefined,
    retryAfterS,
  );
}

// Fetch one API URL with the stored token (unless `auth` is false): the answer when it is 2xx; otherwise an ApiError
// (status 0 when the server cannot be reached; an abort of our own is passed through as is).
async function send(method: string, path: string, options: RequestOptions, headers: Record<string, string>, payload?: BodyInit): Promise<Response> {
  const { query, auth = true, signal } = options;
  const sentToken = auth ? readStoredToken() : null;
  if (sentToken) headers.Authorization = `Bearer ${sentToken}`;
  let response: Response;
  try {
    response = await fetch(buildUrl(path, query), { method, headers, body: payload, signal });
  } catch (cause) {
    if (signal?.aborted) throw cause;
    throw new ApiError(0, 'network_error', 'Cannot reach the Gapsight server. Check the connection and try again.');
  }
  if (!response.ok) throw await refusal(response, sentToken);
  return response;
}

// The ApiError of a non-2xx answer. Only a token we sent that is still the current one ends the session: a wrong
// password at sign-in is an ordinary error, and a burst of parallel 401s for the same token is handled once.
async function refusal(response: Response, sentToken: string | null): Promise<ApiError> {
  const error = await errorFromResponse(response);
  if (response.status === 401 && sentToken && sentToken === readStoredToken() && unauthorizedHandler) unauthorizedHandler(error);
  return error;
}

// The parsed JSON of a 2xx answer (undefined when it has no body).
async function readJson<T>(response: Response): Promise<T> {
  if (response.status === 204) return undefined as T;
  const text = await response.text();
  if (!text) return undefined as T;
  try {
    return JSON.parse(text) as T;
  } catch {
    throw new ApiError(response.status, 'invalid_response', 'The server sent an answer the app could not read.');
  }
}

// Send one request to the API and return its parsed JSON (undefined for 204); throws ApiError on anything else.
export async function apiRequest<T>(method: string, path: string, options: RequestOptions = {}): Promise<T> {
  const { body } = options;
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let payload: BodyInit | undefined;
  if (body instanceof FormData) {
    payload = body; // the browser sets the multipart boundary itself
  } else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }

  return readJson<T>(await send(method, path, options, headers, payload));
}

/** A file to send in a multipart upload, with the name the server should see. */
export interface UploadFile {
  file: Blob;
  name: string;
}

/** Told of an upload's progress: bytes sent so far of `total` (0 when the browser cannot tell the total). */
export type UploadProgress = (sent: number, total: number) => void;

let nextUploadProgress: UploadProgress | null = null;

/**
 * Runs `start` — a src/api wrapper that uploads a file — with `onProgress` told of its bytes as they are sent: the one
 * upload `start` begins (synchronously, as every wrapper does) goes through XMLHttpRequest, which reports upload progress.
 */
export function withUploadProgress<T>(onProgress: UploadProgress, start: () => Promise<T>): Promise<T> {
  nextUploadProgress = onProgress;
  try {
    return start();
  } finally {
    nextUploadProgress = null;
  }
}

// Send a multipart form (`file` plus text fields) and return the parsed JSON. The Content-Type (with its boundary)
// is left to the browser: setting it by hand would drop the boundary and the server could not read the form. With
// `onProgress` (or inside withUploadProgress) the bytes sent are reported as they go.
export function apiUpload<T>(
  path: string,
  upload: UploadFile,
  fields: Record<string, string | number | boolean | null | undefined> = {},
  options: Omit<RequestOptions, 'body'> & { onProgress?: UploadProgress } = {},
): Promise<T> {
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) {
    if (value === null || value === undefined || value === '') continue;
    form.append(key, String(value));
  }
  form.append('file', upload.file, upload.name);
  const { onProgress = nextUploadProgress, ...rest } = options;
  nextUploadProgress = null;
  if (onProgress && upload.file.size >= PROGRESS_MIN_BYTES && typeof XMLHttpRequest !== 'undefined') return uploadWithProgress<T>(path, rest, form, onProgress);
  // A small file is sent at once: reported as sent, so the uploader shows that the server is checking it.
  onProgress?.(upload.file.size, upload.file.size);
  return apiRequest<T>('POST', path, { ...rest, body: form });
}

/** Files from this size on are sent through XMLHttpRequest, whose upload progress is worth showing. */
const PROGRESS_MIN_BYTES = 256 * 1024;

/** The upload of apiUpload through XMLHttpRequest (fetch cannot report upload progress): the same answers and errors. */
async function uploadWithProgress<T>(path: string, options: Omit<RequestOptions, 'body'>, form: FormData, onProgress: UploadProgress): Promise<T> {
  const { query, auth = true, signal } = options;
  const sentToken = auth ? readStoredToken() : null;
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  if (sentToken) headers.Authorization = `Bearer ${sentToken}`;
  const response = await new Promise<Response>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', buildUrl(path, query));
    for (const [k, v] of Object.entries(headers)) xhr.setRequestHeader(k, v);
    xhr.upload.onprogress = (e) => onProgress(e.loaded, e.lengthComputable ? e.total : 0);
    xhr.onload = () => {
      const answerHeaders = new Headers();
      for (const line of xhr.getAllResponseHeaders().trim().split(/[\r\n]+/)) {
        const at = line.indexOf(':');
        if (at > 0) answerHeaders.append(line.slice(0, at).trim(), line.slice(at + 1).trim());
      }
      const empty = xhr.status === 204 || xhr.responseText === '';
      resolve(new Response(empty ? null : xhr.responseText, { status: xhr.status, headers: answerHeaders }));
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'Cannot reach the Gapsight server. Check the connection and try again.'));
    xhr.onabort = () => reject(signal?.reason ?? new DOMException('The upload was stopped.', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
  if (!response.ok) throw await refusal(response, sentToken);
  return readJson<T>(response);
}

// GET a file (an attachment's bytes) with the bearer token; a plain link could not send the token.
export async function apiDownload(path: string, options: Omit<RequestOptions, 'body'> = {}): Promise<Blob> {
  const response = await send('GET', path, options, { ...options.headers });
  return response.blob();
}

// Shorthands for the usual verbs.
export const api = {
  get: <T>(path: string, options?: Omit<RequestOptions, 'body'>) => apiRequest<T>('GET', path, options),
  post: <T>(path: string, body?: unknown, options?: RequestOptions) => apiRequest<T>('POST', path, { ...options, body }),
  patch: <T>(path: string, body?: unknown, options?: RequestOptions) => apiRequest<T>('PATCH', path, { ...options, body }),
  put: <T>(path: string, body?: unknown, options?: RequestOptions) => apiRequest<T>('PUT', path, { ...options, body }),
  delete: <T>(path: string, options?: RequestOptions) => apiRequest<T>('DELETE', path, options),
  upload: apiUpload,
  download: apiDownload,
};
