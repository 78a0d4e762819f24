// The one HTTP client of the Varsmith web app (STYLE habit 12). Every request goes through
// `apiRequest` (or `apiPage` for the paged lists); components and stores never call fetch themselves.
import { TOTAL_COUNT_HEADER, type Page, type PageRequest } from '../../shared/api/paging';

/** One field-level problem reported by the API (CONTRACT section 6 error shape). */
export interface ApiFieldError {
  path: string;
  message: string;
}

/** A failed API call: HTTP status, stable code, message and optional field errors. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: ApiFieldError[];
  /** The parsed error body, kept for callers that need more than the message (e.g. 409 details). */
  readonly body: unknown;

  constructor(status: number, code: string, message: string, fields: ApiFieldError[] = [], body: unknown = null) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = fields;
    this.body = body;
  }
}

type UnauthorizedHandler = () => void;

let bearerToken: string | null = null;
let onUnauthorized: UnauthorizedHandler | null = null;

/** Sets (or clears) the session token sent as `Authorization: Bearer`. */
export function setApiToken(token: string | null): void {
  bearerToken = token;
}

/** Registers what happens when any call answers 401 (the session store signs out and routes to sign-in). */
export function setUnauthorizedHandler(handler: UnauthorizedHandler | null): void {
  onUnauthorized = handler;
}

function absoluteUrl(path: string): string {
  const origin = typeof window !== 'undefined' && window.location ? window.location.origin : 'http://localhost';
  return new URL(path, origin).toString();
}

async function errorFromResponse(response: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    body = null;
  }
  const error = (body as { error?: { code?: unknown; message?: unknown; fields?: unknown } } | null)?.error;
  const message = typeof error?.message === 'string' ? error.message : `${response.status} ${response.statusText || 'request failed'}`;
  const code = typeof error?.code === 'string' ? error.code : `http-${response.status}`;
  const fields = Array.isArray(error?.fields)
    ? (error.fields as unknown[]).filter((f): f is ApiFieldError => typeof (f as ApiFieldError)?.path === 'string' && typeof (f as ApiFieldError)?.message === 'string')
    : [];
  return new ApiError(response.status, code, message, fields, body);
}

async function send(method: string, path: string, body: unknown, accept: string, signal?: AbortSignal): Promise<Response> {
  const headers: Record<string, string> = { Accept: accept };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (bearerToken) headers.Authorization = `Bearer ${bearerToken}`;
  let response: Response;
  try {
    response = await fetch(absoluteUrl(path), { method, headers, body: body === undefined ? undefined : JSON.stringify(body), signal });
  } catch (cause) {
    if ((cause as Error)?.name === 'AbortError') throw cause;
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }
  if (!response.ok) {
    const error = await errorFromResponse(response);
    // Sign-in and the start-up token check handle their own 401; any other 401 ends the session.
    if (response.status === 401 && onUnauthorized && path !== '/api/auth/login' && path !== '/api/auth/me') onUnauthorized();
    throw error;
  }
  return response;
}

/**
 * Sends one JSON request and returns the parsed JSON answer.
 * @param method - HTTP method.
 * @param path - absolute path starting with `/api/`.
 * @param body - request body (serialized as JSON) or undefined.
 * @param signal - optional abort signal.
 * @returns the parsed response body (undefined for 204).
 */
export async function apiRequest<T>(method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, body?: unknown, signal?: AbortSignal): Promise<T> {
  const response = await send(method, path, body, 'application/json', signal);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

/**
 * Sends one request whose answer is text (a report in Markdown).
 * @param path - absolute path starting with `/api/`.
 * @returns the body as text.
 */
export async function apiText(path: string): Promise<string> {
  const response = await send('GET', path, undefined, 'text/markdown, text/plain, */*');
  return response.text();
}

/**
 * A path with query parameters; empty, null and undefined values are left out.
 * @param path - absolute path starting with `/api/`.
 * @param params - the parameters.
 * @returns the path with `?…` when any parameter remains.
 */
export function withQuery(path: string, params: Record<string, string | number | null | undefined>): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value !== undefined && value !== null && value !== '') search.set(key, String(value));
  }
  const query = search.toString();
  return query ? `${path}?${query}` : path;
}

/**
 * Reads one page of a list route: the body is the page's JSON array, the `X-Total-Count` header the
 * number of rows matching the filters (shared/api/paging.ts). Without the header the total is what
 * this page shows up to its end.
 * @param path - absolute path starting with `/api/`, without paging parameters.
 * @param params - filters of the list.
 * @param page - limit and offset.
 * @returns the page.
 */
export async function apiPage<T>(path: string, params: Record<string, string | number | null | undefined>, page: PageRequest): Promise<Page<T>> {
  const response = await send('GET', withQuery(path, { ...params, limit: page.limit, offset: page.offset }), undefined, 'application/json');
  const body = (await response.json()) as T[] | Record<string, unknown>;
  const items = Array.isArray(body) ? body : ((Object.values(body).find(Array.isArray) as T[] | undefined) ?? []);
  const header = response.headers.get(TOTAL_COUNT_HEADER);
  const total = header !== null && Number.isFinite(Number(header)) ? Number(header) : page.offset + items.length;
  return { items, total, limit: page.limit, offset: page.offset };
}

/** Progress of a download: bytes received and total (null when the server sent no length). */
export interface DownloadProgress {
  receivedBytes: number;
  totalBytes: number | null;
}

/** A downloaded file: bytes, the server's file name and its media type. */
export interface DownloadedFile {
  blob: Blob;
  fileName: string | null;
  contentType: string;
}

/**
 * Sends a request whose answer is a file, reporting progress while the body streams in.
 * @param method - HTTP method.
 * @param path - absolute path starting with `/api/`.
 * @param body - JSON body or undefined.
 * @param onProgress - called for every received chunk.
 * @returns the file.
 */
export async function apiDownload(method: 'GET' | 'POST', path: string, body: unknown, onProgress?: (progress: DownloadProgress) => void): Promise<DownloadedFile> {
  const response = await send(method, path, body, 'application/zip, application/octet-stream, */*');
  const lengthHeader = response.headers.get('Content-Length');
  const totalBytes = lengthHeader && Number.isFinite(Number(lengthHeader)) ? Number(lengthHeader) : null;
  const contentType = response.headers.get('Content-Type') ?? 'application/octet-stream';
  const disposition = response.headers.get('Content-Disposition') ?? '';
  const nameMatch = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(disposition);
  const fileName = nameMatch ? decodeURIComponent(nameMatch[1]) : null;
  const chunks: Uint8Array[] = [];
  let receivedBytes = 0;
  if (response.body && typeof response.body.getReader === 'function') {
    const reader = response.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      chunks.push(value);
      receivedBytes += value.byteLength;
      onProgress?.({ receivedBytes, totalBytes });
    }
  } else {
    const buffer = new Uint8Array(await response.arrayBuffer());
    chunks.push(buffer);
    receivedBytes = buffer.byteLength;
    onProgress?.({ receivedBytes, totalBytes });
  }
  return { blob: new Blob(chunks as BlobPart[], { type: contentType }), fileName, contentType };
}
