import type { ApiError } from '@shared/schemas/common';

/** An API answer that was not 2xx, with the server's error code, message and details. */
export class ApiRequestError extends Error {
  constructor(readonly status: number, readonly code: string, message: string, readonly details?: unknown) {
    super(message);
  }
}

async function parse<T>(res: Response): Promise<T> {
  if (res.status === 204) return undefined as T;
  const type = res.headers.get('content-type') ?? '';
  const body = type.includes('application/json') ? await res.json() : await res.text();
  if (!res.ok) {
    const err = (body as ApiError)?.error;
    throw new ApiRequestError(res.status, err?.code ?? 'http_error', err?.message ?? `The server answered ${res.status}`, err?.details);
  }
  return body as T;
}

async function request<T>(method: string, path: string, body?: unknown): Promise<T> {
  let res: Response;
  try {
    res = await fetch(`/api${path}`, {
      method,
      credentials: 'same-origin',
      headers: body !== undefined ? { 'Content-Type': 'application/json' } : undefined,
      body: body !== undefined ? JSON.stringify(body) : undefined,
    });
  } catch {
    throw new ApiRequestError(0, 'network', 'The server could not be reached; check your connection and try again');
  }
  return parse<T>(res);
}

export type UploadProgress = { loaded: number; total: number; fraction: number };

/**
 * Multipart upload with transfer progress (fetch cannot report upload progress; XHR can).
 */
function upload<T>(path: string, form: FormData, onProgress?: (p: UploadProgress) => void, signal?: AbortSignal, method: 'POST' | 'PUT' = 'POST'): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, `/api${path}`);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) onProgress?.({ loaded: e.loaded, total: e.total, fraction: e.total ? e.loaded / e.total : 0 });
    };
    xhr.onerror = () => reject(new ApiRequestError(0, 'network', 'The upload was interrupted; check your connection and try again'));
    xhr.onabort = () => reject(new ApiRequestError(0, 'aborted', 'The upload was cancelled'));
    xhr.onload = () => {
      const res = new Response(xhr.status === 204 ? null : xhr.responseText, { status: xhr.status, headers: { 'content-type': xhr.getResponseHeader('content-type') ?? '' } });
      parse<T>(res).then(resolve, reject);
    };
    signal?.addEventListener('abort', () => xhr.abort());
    xhr.send(form);
  });
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body?: unknown) => request<T>('POST', path, body ?? {}),
  patch: <T>(path: string, body: unknown) => request<T>('PATCH', path, body),
  put: <T>(path: string, body: unknown) => request<T>('PUT', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
  upload,
};

/** Builds a query string from defined values only. */
export function queryString(params: Record<string, string | number | boolean | null | undefined>): string {
  const q = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') q.set(k, String(v));
  const s = q.toString();
  return s ? `?${s}` : '';
}
