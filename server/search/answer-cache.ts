import { LRUCache } from 'lru-cache';
import { can, type Actor } from '../policies/index.ts';
import { searchEngine } from './engine.ts';

/**
 * Search and shade answers, shared by equal questions asked while the indexes stay as they are (issue 16, point 7:
 * at 200 connections a common word, matched by most pieces, cost milliseconds of scoring per request, and the same
 * few questions were asked over and over). An answer is a function of the indexes' state, the question and what the
 * asker may see; `searchEngine.generation` changes with every change applied to either index, so an answer cached
 * under the current generation is exactly what computing it again would give. Every search still catches up with the
 * change log first (`settled()`), so it sees every write committed before it, as before. Each server keeps its own.
 */
const cache = new LRUCache<string, { generation: number; answer: unknown }>({ max: 1_000 });

/** What decides which pieces and facet values an answer may hold. */
export const audienceOf = (actor: Actor) =>
  `${can(actor, 'piece:list-drafts') ? 'drafts' : 'published'}+${can(actor, 'trial:read') ? 'trials' : 'pieces'}`;

export function cachedAnswer<T>(kind: string, audience: string, question: object, compute: () => T): T {
  const key = `${kind}\u0000${audience}\u0000${JSON.stringify(question)}`;
  const generation = searchEngine.generation;
  const hit = cache.get(key);
  if (hit && hit.generation === generation) return hit.answer as T;
  const answer = compute();
  cache.set(key, { generation, answer });
  return answer;
}

/** Forget every cached answer (tests). */
export function clearAnswerCache() {
  cache.clear();
}
