import { CSRF_HEADER } from '../../server/auth/csrf.ts';

interface Cookie {
  value: string;
  path: string;
}

/**
 * A small stand-in for a browser over real HTTP: keeps cookies per host (like a browser, not per port),
 * follows redirects by hand and submits HTML forms, so sign-in runs the whole OpenID Connect flow.
 */
export class Browser {
  private readonly jar = new Map<string, Map<string, Cookie>>();
  /** Every URL visited, redirects included, in order. */
  readonly visited: string[] = [];
  /** Set-Cookie lines received, with the URL that sent them. */
  readonly setCookies: { url: string; line: string }[] = [];

  cookie(host: string, name: string): string | undefined {
    return this.jar.get(host)?.get(name)?.value;
  }

  /** Plants a cookie, as an attacker fixing a session id would. */
  setCookie(host: string, name: string, value: string): void {
    const cookies = this.jar.get(host) ?? new Map<string, Cookie>();
    cookies.set(name, { value, path: '/' });
    this.jar.set(host, cookies);
  }

  private cookieHeader(url: URL): string {
    const cookies = this.jar.get(url.hostname);
    if (!cookies) return '';
    return [...cookies.entries()]
      .filter(([, c]) => url.pathname.startsWith(c.path))
      .map(([name, c]) => `${name}=${c.value}`)
      .join('; ');
  }

  private store(url: URL, response: Response): void {
    for (const line of response.headers.getSetCookie()) {
      this.setCookies.push({ url: url.toString(), line });
      const [pair = '', ...attributes] = line.split(';').map((part) => part.trim());
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq);
      const value = pair.slice(eq + 1);
      const attr = new Map(attributes.map((a) => [a.split('=')[0]!.toLowerCase(), a.split('=').slice(1).join('=')]));
      const expires = attr.get('expires');
      const maxAge = attr.get('max-age');
      const cookies = this.jar.get(url.hostname) ?? new Map<string, Cookie>();
      this.jar.set(url.hostname, cookies);
      const gone = (maxAge !== undefined && Number(maxAge) <= 0) || (expires !== undefined && Date.parse(expires) <= Date.now());
      if (gone) cookies.delete(name);
      else cookies.set(name, { value, path: attr.get('path') || '/' });
    }
  }

  /** One request, no redirect following. */
  async request(url: string, init: RequestInit = {}): Promise<Response> {
    const target = new URL(url);
    const headers = new Headers(init.headers);
    const cookie = this.cookieHeader(target);
    if (cookie) headers.set('cookie', cookie);
    const response = await fetch(target, { ...init, headers, redirect: 'manual' });
    this.visited.push(target.toString());
    this.store(target, response);
    return response;
  }

  /** A request that follows redirects (GET after the first hop), as a browser does. */
  async navigate(url: string, init: RequestInit = {}): Promise<{ response: Response; url: string; body: string }> {
    let current = url;
    let response = await this.request(current, init);
    for (let hops = 0; response.status >= 300 && response.status < 400 && response.headers.get('location'); hops++) {
      if (hops > 20) throw new Error(`Too many redirects from ${url}`);
      current = new URL(response.headers.get('location')!, current).toString();
      response = await this.request(current);
    }
    return { response, url: current, body: await response.text() };
  }

  /** Fills and submits the first form on a page (hidden fields kept, `fields` added), following redirects. */
  async submitForm(pageUrl: string, html: string, fields: Record<string, string>) {
    const form = /<form[^>]*action="([^"]*)"[^>]*>([\s\S]*?)<\/form>/i.exec(html);
    if (!form) throw new Error(`No form on ${pageUrl}:\n${html.slice(0, 500)}`);
    const action = new URL(form[1]!.replace(/&amp;/g, '&'), pageUrl).toString();
    const body = new URLSearchParams();
    for (const input of form[2]!.matchAll(/<input[^>]*type="hidden"[^>]*>/gi)) {
      const name = /name="([^"]*)"/.exec(input[0])?.[1];
      const value = /value="([^"]*)"/.exec(input[0])?.[1] ?? '';
      if (name) body.set(name, value.replace(/&amp;/g, '&').replace(/&quot;/g, '"'));
    }
    for (const [name, value] of Object.entries(fields)) body.set(name, value);
    return this.navigate(action, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body });
  }

  /** Signs in through the app's /auth/login, the provider's sign-in page and back. */
  async signIn(appBaseUrl: string, email: string, password: string): Promise<void> {
    const page = await this.navigate(`${appBaseUrl}/auth/login`);
    // With a live provider session the provider answers at once, without its sign-in page.
    const landed = page.url.startsWith(appBaseUrl) ? page : await this.submitForm(page.url, page.body, { email, password });
    if (!landed.url.startsWith(appBaseUrl)) throw new Error(`Sign-in as ${email} ended at ${landed.url}:\n${landed.body.slice(0, 400)}`);
  }

  /** Signs out through the app; the provider's sign-out page submits itself by script, so submit its form as a browser would. */
  async signOut(appBaseUrl: string) {
    const page = await this.navigate(`${appBaseUrl}/auth/logout`);
    return page.url.startsWith(appBaseUrl) ? page : this.submitForm(page.url, page.body, {});
  }

  /** A same-origin API call with JSON, as the client makes it (CSRF header on writes). */
  async api(appBaseUrl: string, method: string, path: string, body?: unknown): Promise<{ status: number; json: unknown }> {
    const headers: Record<string, string> = { accept: 'application/json' };
    if (method !== 'GET') headers[CSRF_HEADER] = '1';
    if (body !== undefined) headers['content-type'] = 'application/json';
    const response = await this.request(`${appBaseUrl}/api${path}`, { method, headers, body: body === undefined ? undefined : JSON.stringify(body) });
    const text = await response.text();
    const isJson = (response.headers.get('content-type') ?? '').includes('json');
    return { status: response.status, json: text && isJson ? JSON.parse(text) : null };
  }
}
