/** A scripted `fetch` for the client tests: answers by method and path, and records every call. */
export interface RecordedCall {
  url: string;
  method: string;
  headers: Record<string, string>;
  body: unknown;
}

export type Answer = { status: number; body?: unknown; text?: string } | 'network-down';

export function fakeFetch(answer: (call: RecordedCall) => Answer) {
  const calls: RecordedCall[] = [];
  const impl = async (input: RequestInfo | URL, init: RequestInit = {}): Promise<Response> => {
    const headers = (init.headers ?? {}) as Record<string, string>;
    const raw = init.body;
    const body = typeof raw === 'string' ? JSON.parse(raw) : raw;
    const call: RecordedCall = { url: String(input), method: init.method ?? 'GET', headers, body };
    calls.push(call);
    const reply = answer(call);
    if (reply === 'network-down') throw new TypeError('Failed to fetch');
    const text = reply.text ?? (reply.body === undefined ? '' : JSON.stringify(reply.body));
    return new Response(reply.status === 204 ? null : text, { status: reply.status, headers: { 'Content-Type': 'application/json' } });
  };
  return { impl, calls };
}

/** A user as `GET /api/me` gives it (demo data). */
export const ANA = {
  id: '0b6c9c1e-3c1d-4a51-9d0a-4a3f2f0c1a11',
  email: 'ana.reyes@larch-hollow.example',
  name: 'Ana Reyes (demo student)',
  role: 'student' as const,
  demo: true,
  createdAt: '2026-01-05T09:00:00.000Z',
  lastSignInAt: null,
};
