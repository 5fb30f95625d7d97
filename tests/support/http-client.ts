/**
 * A small cookie-keeping HTTP client for server tests: real requests over loopback,
 * Angular's XSRF convention (cookie XSRF-TOKEN echoed as X-XSRF-TOKEN).
 */
export interface Reply<T = any> {
  status: number;
  headers: Headers;
  body: T;
  text: string;
}

export class TestClient {
  readonly cookies = new Map<string, string>();

  constructor(readonly baseUrl: string) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keepCookies(headers: Headers) {
    for (const line of headers.getSetCookie()) {
      const [pair = '', ...attrs] = line.split(';'); // split always yields at least one part
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      const expired = attrs.some((a) => /expires=thu, 01 jan 1970/i.test(a)) || value === '';
      if (expired) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  async request<T = any>(
    method: string,
    path: string,
    body?: unknown,
    init: { headers?: Record<string, string>; raw?: BodyInit } = {},
  ): Promise<Reply<T>> {
    if (method !== 'GET' && !this.cookies.has('XSRF-TOKEN')) await this.request('GET', '/api/auth/me');
    const headers: Record<string, string> = { ...init.headers };
    if (this.cookies.size) headers['cookie'] = this.cookieHeader();
    const xsrf = this.cookies.get('XSRF-TOKEN');
    if (xsrf && method !== 'GET' && !('x-xsrf-token' in headers)) headers['x-xsrf-token'] = decodeURIComponent(xsrf);
    let payload: BodyInit | undefined = init.raw;
    if (body !== undefined && payload === undefined) {
      headers['content-type'] ??= 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(this.baseUrl + path, { method, headers, body: payload, redirect: 'manual' });
    this.keepCookies(res.headers);
    const text = await res.text();
    let parsed: unknown = text;
    if ((res.headers.get('content-type') ?? '').includes('json') && text) parsed = JSON.parse(text);
    return { status: res.status, headers: res.headers, body: parsed as T, text };
  }

  get<T = any>(path: string) {
    return this.request<T>('GET', path);
  }
  post<T = any>(path: string, body?: unknown) {
    return this.request<T>('POST', path, body ?? {});
  }
  put<T = any>(path: string, body?: unknown) {
    return this.request<T>('PUT', path, body ?? {});
  }
  patch<T = any>(path: string, body?: unknown) {
    return this.request<T>('PATCH', path, body ?? {});
  }
  delete<T = any>(path: string) {
    return this.request<T>('DELETE', path);
  }

  async signIn(email: string, password: string): Promise<Reply> {
    const reply = await this.post('/api/auth/sign-in', { email, password });
    if (reply.status !== 200) throw new Error(`sign-in failed for ${email}: ${reply.status} ${reply.text}`);
    return reply;
  }
}
