// The concurrent-burst scenario of issue 12: many cases created and retitled in parallel
// through the API, in one shop, while searches run; then every case must be found by the
// unique word in its title (the new word for a retitled case, never the old one).
import { withinOneEdit } from '../../shared/search/text';
import { searchResponseSchema } from '../../shared/schemas/search';
import type { signedIn } from './test-app';

export type Client = Awaited<ReturnType<typeof signedIn>>;

export interface BurstPlan {
  /** who saves: creates go round these in turn, and a retitle goes to the next one after its creator */
  writers: Client[];
  /** who searches meanwhile, and whose search must find every case afterwards (one per instance) */
  searchers: Client[];
  creates: number;
  edits: number;
  /** requests in flight at once (default 16) */
  parallel?: number;
  /** how long the index may take to show everything after the last save (default 10 s) */
  convergeWithinMs?: number;
}

export interface BurstReport {
  cases: number;
  edits: number;
  searchesDuring: number;
  /** checks (one case, one searcher) still wrong when the wait ran out */
  misses: string[];
  /** from the last save until every check passed (or the wait ran out) */
  convergeMs: number;
  /** passes over the checks it took (1: everything was right at the first look) */
  passes: number;
}

interface Saved {
  id: number;
  word: string;
  oldWord: string | null;
}

const CONSONANTS = 'bfkmptvz';
const VOWELS = 'aiou';
const issued: string[] = [];

/**
 * A seven-letter made-up word, unlike every word issued before: consonant-vowel pairs ending
 * in a consonant that no stemming rule touches, all the same length (so none is another's
 * prefix) and never one typo from another (so a fuzzy match cannot stand in for it).
 */
export function uniqueWord(): string {
  for (;;) {
    let w = '';
    for (let i = 0; i < 7; i++) {
      const letters = i % 2 === 0 ? CONSONANTS : VOWELS;
      w += letters[Math.floor(Math.random() * letters.length)];
    }
    if (issued.some((x) => withinOneEdit(x, w))) continue;
    issued.push(w);
    return w;
  }
}

const titleWith = (word: string) => `Intermittent fault ${word} after wet weather`;

/** Runs `jobs` with at most `parallel` in flight. */
async function inParallel(jobs: (() => Promise<void>)[], parallel: number) {
  let next = 0;
  const lanes = Array.from({ length: Math.min(parallel, jobs.length) }, async () => {
    while (next < jobs.length) await jobs[next++]!();
  });
  await Promise.all(lanes);
}

async function idsFor(client: Client, word: string): Promise<number[]> {
  const res = await client.agent.get('/api/search').query({ q: word, limit: 50 });
  if (res.status !== 200) throw new Error(`search "${word}" answered ${res.status}: ${JSON.stringify(res.body)}`);
  return searchResponseSchema.parse(res.body).results.map((r) => r.id);
}

async function save(plan: BurstPlan, saved: Saved[]) {
  const { writers } = plan;
  let turn = 0;
  const jobs = Array.from({ length: plan.creates }, (_, n) => async () => {
    const creator = writers[turn++ % writers.length]!;
    const word = uniqueWord();
    const res = await creator.agent
      .post('/api/cases')
      .set('X-CSRF-Token', creator.csrf)
      .send({ title: titleWith(word), body: 'Fault came and went; noted during the burst test.', codes: [], symptoms: [], status: 'published' });
    if (res.status !== 201) throw new Error(`create answered ${res.status}: ${JSON.stringify(res.body)}`);
    const item: Saved = { id: res.body.id, word, oldWord: null };
    saved.push(item);
    // spread the retitles through the burst: every k-th case is retitled right after it is saved
    if (n % Math.max(1, Math.floor(plan.creates / plan.edits)) !== 0 || saved.filter((s) => s.oldWord).length >= plan.edits) return;
    const editor = writers[(writers.indexOf(creator) + 1) % writers.length]!;
    const newWord = uniqueWord();
    item.oldWord = word;
    item.word = newWord;
    const edit = await editor.agent.patch(`/api/cases/${item.id}`).set('X-CSRF-Token', editor.csrf).send({ title: titleWith(newWord), version: res.body.version });
    if (edit.status !== 200) throw new Error(`retitle answered ${edit.status}: ${JSON.stringify(edit.body)}`);
  });
  await inParallel(jobs, plan.parallel ?? 16);
}

/** Searches for words already saved, one after another per searcher, until `done` settles. */
async function searchMeanwhile(searchers: Client[], saved: Saved[], done: Promise<unknown>): Promise<number> {
  let finished = false;
  void done.finally(() => (finished = true)).catch(() => undefined);
  let count = 0;
  await Promise.all(
    searchers.map(async (client) => {
      while (!finished) {
        const pick = saved[Math.floor(Math.random() * saved.length)];
        await idsFor(client, pick?.word ?? 'intermittent');
        count++;
      }
    }),
  );
  return count;
}

/** One check: the case is found by its word and, if retitled, not by its old one. */
async function holds(client: Client, item: Saved): Promise<boolean> {
  if (!(await idsFor(client, item.word)).includes(item.id)) return false;
  return item.oldWord === null || !(await idsFor(client, item.oldWord)).includes(item.id);
}

export async function runBurst(plan: BurstPlan): Promise<BurstReport> {
  const saved: Saved[] = [];
  const saving = save(plan, saved);
  const [searchesDuring] = await Promise.all([searchMeanwhile(plan.searchers, saved, saving), saving]);

  const lastSave = Date.now();
  const deadline = lastSave + (plan.convergeWithinMs ?? 10_000);
  let passes = 0;
  let open = plan.searchers.flatMap((client, n) => saved.map((item) => ({ client, n, item })));
  while (open.length > 0 && Date.now() < deadline) {
    passes++;
    const still: typeof open = [];
    await inParallel(
      open.map((check) => async () => {
        if (!(await holds(check.client, check.item))) still.push(check);
      }),
      8,
    );
    open = still;
    if (open.length > 0) await new Promise((r) => setTimeout(r, 100));
  }
  return {
    cases: saved.length,
    edits: saved.filter((s) => s.oldWord).length,
    searchesDuring,
    misses: open.map(({ n, item }) => `searcher ${n}: case ${item.id} "${item.word}"${item.oldWord ? ` (was "${item.oldWord}")` : ''}`),
    convergeMs: Date.now() - lastSave,
    passes,
  };
}
