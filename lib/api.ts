import { isApiErrorBody } from '@/shared/errors';

/** An API answer that was not 2xx, carrying the server's message and per-field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

/** Fetches JSON from our own origin with the session cookie; throws ApiError with the server's words. */
export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, {
      method: init.method ?? 'GET',
      credentials: 'same-origin',
      headers: init.body === undefined ? undefined : { 'content-type': 'application/json' },
      body: init.body === undefined ? undefined : JSON.stringify(init.body),
    });
  } catch {
    throw new ApiError(0, 'offline', 'Cannot reach the Lobewright server. Check the connection and try again.');
  }
  return readAnswer<T>(res);
}

/**
 * Sends files (and any text fields) as multipart form data to our own origin.
 * The browser sets the multipart boundary; errors come back as ApiError like api().
 */
export async function upload<T>(path: string, form: FormData, init: { method?: string } = {}): Promise<T> {
  let res: Response;
  try {
    res = await fetch(path, { method: init.method ?? 'POST', credentials: 'same-origin', body: form });
  } catch {
    throw new ApiError(0, 'offline', 'Cannot reach the Lobewright server. Check the connection and try again.');
  }
  return readAnswer<T>(res);
}

async function readAnswer<T>(res: Response): Promise<T> {
  const text = await res.text();
  const data: unknown = text ? safeJson(text) : null;
  if (!res.ok) {
    if (isApiErrorBody(data)) {
      throw new ApiError(res.status, data.error.code, data.error.message, data.error.fields);
    }
    // better-auth answers { message, code }, and our password check adds { fields }.
    const { message, fields } = (data ?? {}) as { message?: unknown; fields?: unknown };
    const named =
      typeof fields === 'object' && fields !== null
        ? Object.fromEntries(Object.entries(fields).filter((e): e is [string, string] => typeof e[1] === 'string'))
        : {};
    throw new ApiError(res.status, 'error', typeof message === 'string' ? message : `The server answered ${res.status}`, named);
  }
  return data as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return { message: text.slice(0, 200) };
  }
}

export const staleTimes = {
  /** Who is signed in changes only on sign-in, sign-out and shop switch. */
  session: 5 * 60_000,
  list: 30_000,
  record: 15_000,
} as const;

/** `path` asking for the page after `cursor` (the previous page's nextCursor); null is the first page. */
export function pagePath(path: string, cursor: string | null) {
  return cursor === null ? path : `${path}${path.includes('?') ? '&' : '?'}cursor=${encodeURIComponent(cursor)}`;
}
