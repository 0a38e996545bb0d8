// The one API client. Components never call fetch: features wrap these calls in TanStack Query
// `queryOptions`/mutations, with keys from `queryKeys` below.

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export async function api<T>(path: string, init: { method?: string; body?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  const res = await fetch(`/api${path}`, {
    method: init.method ?? 'GET',
    credentials: 'same-origin',
    headers: init.body !== undefined ? { 'content-type': 'application/json' } : undefined,
    body: init.body !== undefined ? JSON.stringify(init.body) : undefined,
    signal: init.signal,
  });
  const text = await res.text();
  const data = text ? safeJson(text) : null;
  if (!res.ok) {
    const err = (data as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `${res.status} ${res.statusText}`, err?.details);
  }
  return data as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return { error: { code: 'bad_response', message: text.slice(0, 200) } };
  }
}

/** Every query key in one place. */
export const queryKeys = {
  me: ['me'] as const,
  workbooks: ['workbooks'] as const,
  workbook: (id: string) => ['workbooks', id] as const,
  storedValues: (id: string) => ['workbooks', id, 'stored-values'] as const,
  revisions: (id: string) => ['workbooks', id, 'revisions'] as const,
  members: (id: string) => ['workbooks', id, 'members'] as const,
  audit: (id: string) => ['workbooks', id, 'audit'] as const,
  revision: (id: string, n: number) => ['workbooks', id, 'revisions', n] as const,
  invitations: (id: string) => ['workbooks', id, 'invitations'] as const,
  protection: (id: string) => ['workbooks', id, 'protection'] as const,
  invitationLink: (token: string) => ['invitation-links', token] as const,
  adminUsers: ['admin', 'users'] as const,
  adminMail: ['admin', 'mail'] as const,
};
