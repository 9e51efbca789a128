import { z } from 'zod';
import { Manifest } from './manifest-schema.js';

let known: readonly string[] | undefined;

/** Every key the manifest knows anywhere (from its JSON Schema), for suggestions. */
function manifestKeys(): readonly string[] {
  if (known) return known;
  const keys = new Set<string>();
  const walk = (node: unknown): void => {
    if (Array.isArray(node)) return node.forEach(walk);
    if (!node || typeof node !== 'object') return;
    for (const [k, v] of Object.entries(node)) {
      if (k === 'properties' && v && typeof v === 'object') for (const p of Object.keys(v)) keys.add(p);
      walk(v);
    }
  };
  walk(z.toJSONSchema(Manifest, { io: 'input', unrepresentable: 'any' }));
  known = [...keys];
  return known;
}

/** The known key nearest to a mistyped one (British spelling, a slip of two letters), if one is near enough. */
export function nearestKey(typed: string): string | undefined {
  let best: { key: string; d: number } | undefined;
  for (const key of manifestKeys()) {
    const d = editDistance(typed.toLowerCase(), key.toLowerCase());
    if (!best || d < best.d) best = { key, d };
  }
  return best && best.d <= Math.max(2, Math.floor(typed.length / 6)) ? best.key : undefined;
}

/** Levenshtein distance: insertions, deletions and substitutions, one each. */
function editDistance(a: string, b: string): number {
  let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const cur = [i];
    for (let j = 1; j <= b.length; j++) cur[j] = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
    prev = cur;
  }
  return prev[b.length]!;
}
