/** The git commands the action needs: changed files between two commits, a file at a commit. */
import { execFile } from 'node:child_process';
import { decodeSvgBytes } from '../engine/read/read-file.js';

export class GitError extends Error {
  override readonly name = 'GitError';
}

/** Largest file read from git, in bytes (the reader's own limit is in characters; this only bounds memory). */
const MAX_BYTES = 256 * 1024 * 1024;

function git(args: string[], cwd: string, encoding: 'buffer'): Promise<Buffer>;
function git(args: string[], cwd: string, encoding?: 'utf8'): Promise<string>;
function git(args: string[], cwd: string, encoding: 'utf8' | 'buffer' = 'utf8'): Promise<string | Buffer> {
  return new Promise((resolve, reject) => {
    execFile(
      'git',
      ['-c', 'core.quotepath=off', ...args],
      { cwd, encoding, maxBuffer: MAX_BYTES, env: { ...process.env, GIT_TERMINAL_PROMPT: '0', LC_ALL: 'C' } },
      (err, stdout, stderr) => {
        if (err) {
          const msg = String(stderr || err.message).trim().split('\n')[0];
          reject(new GitError(`git ${args[0]} failed: ${msg}`));
        } else resolve(stdout);
      },
    );
  });
}

export async function hasCommit(sha: string, cwd: string): Promise<boolean> {
  try {
    await git(['cat-file', '-e', `${sha}^{commit}`], cwd);
    return true;
  } catch {
    return false;
  }
}

/** Fetches commits the checkout lacks (a shallow clone), from `origin`. */
export async function fetchCommits(shas: string[], cwd: string): Promise<void> {
  await git(['fetch', '--no-tags', '--quiet', '--depth=1', 'origin', ...shas], cwd);
}

export type ChangeStatus = 'added' | 'modified' | 'deleted' | 'renamed' | 'copied' | 'type-changed';

export interface FileChange {
  status: ChangeStatus;
  /** Path at the head commit (for deletions: the deleted path). */
  path: string;
  /** Path at the base commit (differs for renames and copies). */
  basePath: string | null;
}

const STATUS: Record<string, ChangeStatus> = { A: 'added', M: 'modified', D: 'deleted', R: 'renamed', C: 'copied', T: 'type-changed' };

/** Parses `git diff --name-status -z` output. */
export function parseNameStatus(out: string): FileChange[] {
  const parts = out.split('\0');
  const changes: FileChange[] = [];
  let i = 0;
  while (i < parts.length) {
    const code = parts[i++];
    if (!code) continue;
    const status = STATUS[code[0]!];
    if (!status) throw new GitError(`unexpected status "${code}" from git diff`);
    if (status === 'renamed' || status === 'copied') {
      const from = parts[i++];
      const to = parts[i++];
      if (from === undefined || to === undefined) throw new GitError('truncated rename in git diff output');
      changes.push({ status, path: to, basePath: from });
    } else {
      const p = parts[i++];
      if (p === undefined) throw new GitError('truncated git diff output');
      changes.push({ status, path: p, basePath: status === 'added' ? null : p });
    }
  }
  return changes;
}

/**
 * Files changed on the head side since the merge base (`base...head`). When
 * the clone has no merge base (shallow history), falls back to the direct
 * difference of the two trees and says so.
 */
export async function changedFiles(base: string, head: string, cwd: string): Promise<{ changes: FileChange[]; mergeBase: boolean }> {
  const args = ['diff', '--name-status', '-z', '--find-renames', '--no-ext-diff'];
  try {
    return { changes: parseNameStatus(await git([...args, `${base}...${head}`, '--'], cwd)), mergeBase: true };
  } catch (err) {
    if (!(err instanceof GitError) || !/merge base/i.test(err.message)) throw err;
    return { changes: parseNameStatus(await git([...args, base, head, '--'], cwd)), mergeBase: false };
  }
}

/** A file's text at a commit (UTF-8, or UTF-16 with a byte-order mark). */
export async function showFile(rev: string, path: string, cwd: string): Promise<string> {
  const bytes = await git(['show', `${rev}:${path}`], cwd, 'buffer');
  return decodeSvgBytes(bytes, path);
}
