// Test helpers for client components: a scripted fetch, a signed-in or signed-out start, and the whole app mounted
// on a memory-history router (QPage needs QLayout > QPageContainer, which the app's own layouts provide).
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils';
import { createPinia, setActivePinia, type Pinia } from 'pinia';
import { Quasar } from 'quasar';
import { vi } from 'vitest';
import { createMemoryHistory, type Router, type RouteRecordRaw } from 'vue-router';
import App from '../../src/App.vue';
import { TOKEN_STORAGE_KEY } from '../../src/api/client';
import type { HealthStatus, SessionUser } from '../../src/api/auth';
import { quasarOptions } from '../../src/quasar-options';
import { createAppRouter } from '../../src/router';

export interface ScriptedResponse {
  status?: number;
  body?: unknown;
  headers?: Record<string, string>;
}

type Reply = ScriptedResponse | ((request: RecordedRequest) => ScriptedResponse | Promise<ScriptedResponse>) | Error;

export interface RecordedRequest {
  method: string;
  url: string;
  headers: Record<string, string>;
  body: unknown;
}

export function jsonResponse({ status = 200, body, headers = {} }: ScriptedResponse): Response {
  const text = body === undefined ? null : typeof body === 'string' ? body : JSON.stringify(body);
  const contentType = typeof body === 'string' ? 'text/html' : 'application/json';
  return new Response(status === 204 ? null : text, { status, headers: { 'Content-Type': contentType, ...headers } });
}

// Replace global fetch with a script keyed by "METHOD /path" (query string ignored); unknown requests fail the test
// loudly with a 599 so a missing script entry is never mistaken for success.
export function scriptFetch(script: Record<string, Reply>) {
  const requests: RecordedRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = String(input);
    const method = (init.method ?? 'GET').toUpperCase();
    // Header names lower-cased (happy-dom's Headers keeps the case it was given).
    const headers = Object.fromEntries([...new Headers(init.headers).entries()].map(([k, v]) => [k.toLowerCase(), v]));
    let body: unknown = init.body;
    if (typeof init.body === 'string') {
      try {
        body = JSON.parse(init.body);
      } catch {
        body = init.body;
      }
    }
    const request: RecordedRequest = { method, url, headers, body };
    requests.push(request);
    const reply = script[`${method} ${url.split('?')[0]}`];
    if (reply === undefined) {
      return jsonResponse({ status: 599, body: { error: { code: 'unscripted', message: `No script for ${method} ${url}` } } });
    }
    if (reply instanceof Error) throw reply;
    return jsonResponse(typeof reply === 'function' ? await reply(request) : reply);
  });
  vi.stubGlobal('fetch', fetchMock);
  return { fetchMock, requests };
}

export const healthy: HealthStatus = { status: 'ok', db: 'ok', demo: false, mailSink: false };
export const healthyDemo: HealthStatus = { status: 'ok', db: 'ok', demo: true, mailSink: true };

export function makeUser(overrides: Partial<SessionUser> = {}): SessionUser {
  return { id: 7, email: 'r.okafor@kestrel-valley.example', name: 'Ruth Okafor', roles: ['tester'], siteIds: [], allSites: true, active: true, demo: false, mustChangePassword: false, lastSignInAt: null, ...overrides };
}

export function storeToken(token: string | null): void {
  if (token) localStorage.setItem(TOKEN_STORAGE_KEY, token);
  else localStorage.removeItem(TOKEN_STORAGE_KEY);
}

export interface MountedApp {
  wrapper: VueWrapper;
  router: Router;
  pinia: Pinia;
}

// Mount the whole app at `path`, wait for the first navigation and the requests it starts.
export async function mountApp(path: string, options: { routes?: RouteRecordRaw[] } = {}): Promise<MountedApp> {
  const pinia = createPinia();
  setActivePinia(pinia);
  const router = createAppRouter({ history: createMemoryHistory(), routes: options.routes });
  // Navigate before mounting, so the router's own start-up navigation (to '/') does not run first.
  await router.push(path);
  const wrapper = mount(App, {
    attachTo: document.body,
    global: { plugins: [pinia, [Quasar, quasarOptions], router] },
  });
  await router.isReady();
  await settle();
  return { wrapper, router, pinia };
}

// Reset what a test may leave behind: stubbed fetch, stored token.
export function resetClientState(): void {
  vi.unstubAllGlobals();
  localStorage.clear();
  document.body.innerHTML = '';
}

// Let promises, lazy route components and re-renders finish.
export async function settle(): Promise<void> {
  for (let i = 0; i < 5; i += 1) {
    await flushPromises();
    await new Promise((resolve) => setTimeout(resolve, 0));
  }
}

/** Stubs the browser's save-a-file steps: the blobs handed to object URLs, and the link clicks (with their file name). */
export function captureDownloads() {
  const blobs: Blob[] = [];
  vi.spyOn(URL, 'createObjectURL').mockImplementation((blob) => {
    blobs.push(blob as Blob);
    return 'blob:download';
  });
  vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
  const clicked = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(() => undefined);
  /** The file name of the n-th clicked download link. */
  const fileName = (n = 0) => (clicked.mock.contexts[n] as HTMLAnchorElement).download;
  return { blobs, fileName };
}

/** Types into a field anywhere in the document (dialogs are teleported out of the wrapper): the input or textarea
 * carrying `data-test`, or the input inside the element carrying it. */
export async function typeInDocument(testId: string, value: string): Promise<void> {
  const input = document.body.querySelector<HTMLInputElement>(`[data-test="${testId}"] input, input[data-test="${testId}"], textarea[data-test="${testId}"]`)!;
  input.value = value;
  input.dispatchEvent(new Event('input'));
  await settle();
}

/** An element of a dialog (teleported to the body) by its data-test name, or all of them. */
export const inBody = (testId: string) => document.body.querySelector(`[data-test="${testId}"]`) as HTMLElement | null;
export const allInBody = (testId: string) => [...document.body.querySelectorAll(`[data-test="${testId}"]`)] as HTMLElement[];

/** Picks a file in the (only) file input on the page, as the browser's file chooser would. */
export async function pickFileInBody(file: File): Promise<void> {
  await settle();
  const input = document.body.querySelector('input[type="file"]') as HTMLInputElement;
  Object.defineProperty(input, 'files', { value: [file], configurable: true, writable: true });
  input.dispatchEvent(new Event('change'));
  await settle();
}

/** The non-file fields of a recorded multipart request. */
export const formFieldsOf = (r: RecordedRequest) => Object.fromEntries([...(r.body as FormData).entries()].filter(([k]) => k !== 'file'));
