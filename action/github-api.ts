/**
 * The one pull-request comment the action keeps: found by a hidden marker at
 * the start of its body (listing every page of comments), then edited;
 * created when there is none. REST calls with `fetch`.
 */

export interface ApiTarget {
  /** Base URL of the REST API, e.g. https://api.github.com (GITHUB_API_URL). */
  apiUrl: string;
  token: string;
  owner: string;
  repo: string;
}

export type CommentOutcome =
  | { outcome: 'created' | 'updated'; id: number; url: string | null }
  | { outcome: 'forbidden'; status: number; message: string };

export class ApiError extends Error {
  override readonly name = 'ApiError';
  constructor(
    message: string,
    readonly status: number,
  ) {
    super(message);
  }
}

const PER_PAGE = 100;
/** Pages read at most while looking for the marker (10,000 comments). */
const MAX_PAGES = 100;
const TIMEOUT_MS = 30_000;

interface IssueComment {
  id: number;
  body?: string | null;
  html_url?: string;
}

function endpoint(t: ApiTarget, path: string): string {
  return `${t.apiUrl.replace(/\/+$/, '')}${path}`;
}

async function call(t: ApiTarget, method: 'GET' | 'POST' | 'PATCH', path: string, body?: { body: string }): Promise<{ status: number; json: unknown; link: string | null }> {
  const headers: Record<string, string> = {
    Accept: 'application/vnd.github+json',
    'X-GitHub-Api-Version': '2022-11-28',
    'User-Agent': 'plumbline-action',
  };
  if (t.token) headers.Authorization = `Bearer ${t.token}`;
  if (body) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await fetch(endpoint(t, path), {
      method,
      headers,
      body: body ? JSON.stringify(body) : undefined,
      signal: AbortSignal.timeout(TIMEOUT_MS),
      redirect: 'follow',
    });
  } catch (err) {
    throw new ApiError(`${method} ${path}: ${(err as Error).message}`, 0);
  }
  const text = await res.text();
  let json: unknown = null;
  try {
    json = text ? JSON.parse(text) : null;
  } catch {
    json = null;
  }
  if (!res.ok) {
    const message = json && typeof json === 'object' && typeof (json as { message?: unknown }).message === 'string' ? (json as { message: string }).message : res.statusText;
    throw new ApiError(`${method} ${path}: ${res.status} ${message}`, res.status);
  }
  return { status: res.status, json, link: res.headers.get('link') };
}

function hasNext(link: string | null): boolean {
  return link !== null && /<[^>]+>\s*;\s*rel="?next"?/.test(link);
}

/** The first comment whose body starts with `marker`, looking through every page. */
export async function findMarkedComment(t: ApiTarget, issue: number, marker: string): Promise<IssueComment | null> {
  for (let page = 1; page <= MAX_PAGES; page++) {
    const { json, link } = await call(t, 'GET', `/repos/${enc(t.owner)}/${enc(t.repo)}/issues/${issue}/comments?per_page=${PER_PAGE}&page=${page}`);
    if (!Array.isArray(json)) throw new ApiError('listing comments: the answer is not a list', 200);
    for (const c of json as IssueComment[]) {
      if (c && typeof c.id === 'number' && typeof c.body === 'string' && c.body.trimStart().startsWith(marker)) return c;
    }
    if (json.length < PER_PAGE && !hasNext(link)) return null;
    if (link !== null && !hasNext(link)) return null;
  }
  return null;
}

const enc = encodeURIComponent;

/**
 * Edits the marked comment or creates it. A 401, 403 or 404 (a token without
 * write access, as on pull requests from forks) is returned as `forbidden`,
 * not thrown.
 */
export async function upsertComment(t: ApiTarget, issue: number, marker: string, body: string): Promise<CommentOutcome> {
  if (!body.trimStart().startsWith(marker)) throw new Error('the comment body must start with its marker');
  try {
    const existing = await findMarkedComment(t, issue, marker);
    if (existing) {
      const { json } = await call(t, 'PATCH', `/repos/${enc(t.owner)}/${enc(t.repo)}/issues/comments/${existing.id}`, { body });
      return { outcome: 'updated', id: existing.id, url: urlOf(json) };
    }
    const { json } = await call(t, 'POST', `/repos/${enc(t.owner)}/${enc(t.repo)}/issues/${issue}/comments`, { body });
    const id = json && typeof json === 'object' && typeof (json as { id?: unknown }).id === 'number' ? (json as { id: number }).id : -1;
    return { outcome: 'created', id, url: urlOf(json) };
  } catch (err) {
    if (err instanceof ApiError && (err.status === 401 || err.status === 403 || err.status === 404)) return { outcome: 'forbidden', status: err.status, message: err.message };
    throw err;
  }
}

function urlOf(json: unknown): string | null {
  return json && typeof json === 'object' && typeof (json as { html_url?: unknown }).html_url === 'string' ? (json as { html_url: string }).html_url : null;
}
