/** Deterministic sharding: a file belongs to shard (hash(path) mod N) + 1, whatever machine runs it. */
export function shardOf(path: string, n: number): number {
  // FNV-1a, 32 bit, over the UTF-16 code units of the path as given.
  let h = 0x811c9dc5;
  for (let i = 0; i < path.length; i++) {
    h ^= path.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return (h % n) + 1;
}

export function inShard(path: string, shard: { k: number; n: number } | null): boolean {
  return !shard || shardOf(path, shard.n) === shard.k;
}
