/** A tiny HTTP client with a cookie jar, speaking to the real server like a browser would. */
import { inject } from 'vitest'

export interface ApiResponse<T = unknown> {
  status: number
  headers: Headers
  body: T
}

export class ApiClient {
  private cookies = new Map<string, string>()
  constructor(readonly baseURL: string = inject('baseURL')) {}

  /** Sends a request; JSON bodies are serialised, JSON answers parsed. */
  async request<T = any>(method: string, path: string, body?: unknown, headers: Record<string, string> = {}): Promise<ApiResponse<T>> {
    const init: RequestInit = { method, headers: { ...headers, cookie: this.cookieHeader() }, redirect: 'manual' }
    if (body instanceof FormData) init.body = body // fetch writes the multipart boundary itself
    else if (body !== undefined) {
      init.body = typeof body === 'string' ? body : JSON.stringify(body)
      ;(init.headers as Record<string, string>)['content-type'] ??= 'application/json'
    }
    const response = await fetch(`${this.baseURL}${path}`, init)
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';')
      const [name, ...rest] = (pair ?? '').split('=')
      if (name) this.cookies.set(name.trim(), rest.join('='))
    }
    const text = await response.text()
    let parsed: unknown = text
    if (response.headers.get('content-type')?.includes('json') && text) parsed = JSON.parse(text)
    return { status: response.status, headers: response.headers, body: parsed as T }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, body?: unknown) { return this.request<T>('POST', path, body ?? {}) }
  patch<T = any>(path: string, body?: unknown) { return this.request<T>('PATCH', path, body ?? {}) }
  delete<T = any>(path: string) { return this.request<T>('DELETE', path) }

  /** Another client holding the same cookies now: a replayed or stolen cookie once this one moves on. */
  copy(): ApiClient {
    const twin = new ApiClient(this.baseURL)
    for (const [name, value] of this.cookies) twin.cookies.set(name, value)
    return twin
  }

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ')
  }

  /** Signs in and fails loudly if that did not work. */
  async signIn(email: string, password = 'tidewright-demo'): Promise<this> {
    const response = await this.post('/api/auth/login', { email, password })
    if (response.status !== 200) throw new Error(`Sign-in as ${email} failed: ${response.status} ${JSON.stringify(response.body)}`)
    return this
  }
}

/** A client already signed in as the given user. */
export function signedIn(email: string): Promise<ApiClient> {
  return new ApiClient().signIn(email)
}
