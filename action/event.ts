/** What triggered the run, from the variables and the event file the runner provides. */
import { readFileSync } from 'node:fs';

export interface PullRequestContext {
  kind: 'pull_request';
  owner: string;
  repo: string;
  number: number;
  baseSha: string;
  headSha: string;
  /** The head branch lives in another repository (a fork): its token cannot comment. */
  fromFork: boolean;
}

export interface OtherContext {
  kind: 'other';
  eventName: string;
  owner: string | null;
  repo: string | null;
}

export type RunContext = PullRequestContext | OtherContext;

export class EventError extends Error {
  override readonly name = 'EventError';
}

const SHA = /^[0-9a-f]{40}([0-9a-f]{24})?$/;

function repository(env: NodeJS.ProcessEnv): { owner: string | null; repo: string | null } {
  const full = env.GITHUB_REPOSITORY ?? '';
  const m = /^([A-Za-z0-9_.-]+)\/([A-Za-z0-9_.-]+)$/.exec(full);
  return m ? { owner: m[1]!, repo: m[2]! } : { owner: null, repo: null };
}

function field(o: unknown, ...keys: string[]): unknown {
  let cur = o;
  for (const k of keys) {
    if (!cur || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[k];
  }
  return cur;
}

/** Reads GITHUB_EVENT_NAME, GITHUB_EVENT_PATH and GITHUB_REPOSITORY. */
export function readContext(env: NodeJS.ProcessEnv = process.env): RunContext {
  const eventName = env.GITHUB_EVENT_NAME ?? '';
  const { owner, repo } = repository(env);
  if (eventName !== 'pull_request' && eventName !== 'pull_request_target') return { kind: 'other', eventName, owner, repo };
  const path = env.GITHUB_EVENT_PATH;
  if (!path) throw new EventError('GITHUB_EVENT_PATH is not set; cannot read the pull request');
  let event: unknown;
  try {
    event = JSON.parse(readFileSync(path, 'utf8'));
  } catch (err) {
    throw new EventError(`cannot read the event file ${path}: ${(err as Error).message}`);
  }
  const number = field(event, 'pull_request', 'number') ?? field(event, 'number');
  const baseSha = field(event, 'pull_request', 'base', 'sha');
  const headSha = field(event, 'pull_request', 'head', 'sha');
  if (typeof number !== 'number' || !Number.isInteger(number) || number < 1) throw new EventError('the event has no pull request number');
  if (typeof baseSha !== 'string' || !SHA.test(baseSha)) throw new EventError('the event has no base commit (pull_request.base.sha)');
  if (typeof headSha !== 'string' || !SHA.test(headSha)) throw new EventError('the event has no head commit (pull_request.head.sha)');
  if (!owner || !repo) throw new EventError('GITHUB_REPOSITORY is not set as owner/name');
  const headRepo = field(event, 'pull_request', 'head', 'repo', 'full_name');
  const baseRepo = field(event, 'pull_request', 'base', 'repo', 'full_name');
  const fromFork = typeof headRepo === 'string' && typeof baseRepo === 'string' && headRepo !== baseRepo;
  return { kind: 'pull_request', owner, repo, number, baseSha, headSha, fromFork };
}
