// npm run bench:walks [-- --cases]: replays every confirmed, linked case of the demo shop
// leave-one-out (server/walks/replay.ts) and prints where the true cause lands and the minutes
// of testing until it is reached, for tree priors only, learned priors, and most-likely-first.
import path from 'node:path';
import { loadConfig } from '../config';
import { readDemoHistory } from '../seed/demo-history';
import { contentTrees } from '../trees/service';
import { POLICY_LABELS, replayAll, summarise } from '../walks/replay';

const root = loadConfig().root;
const trees = [...contentTrees(root).values()].map((t) => t.tree);
const confirmed = readDemoHistory(path.join(root, 'content')).cases.filter((c) => c.confirmed && c.cause);
const results = replayAll(trees, confirmed);
const rows = summarise(results);
const base = rows[0]!.meanMinutes;

const pct = (x: number) => `${(100 * x).toFixed(0)} %`;
console.log(`Leave-one-out replay of ${results.length} confirmed, linked demo cases (${confirmed.length - results.length} chose no tree).\n`);
console.log('| policy | true cause in first 3 steps | mean rank | mean minutes to the true cause | vs tree priors | true cause not in the walk |');
console.log('|---|---|---|---|---|---|');
for (const r of rows) {
  const change = r.meanMinutes / base - 1;
  console.log(`| ${POLICY_LABELS[r.policy]} | ${pct(r.inFirstThree)} | ${r.meanRank.toFixed(2)} | ${r.meanMinutes.toFixed(1)} | ${change === 0 ? '-' : `${change > 0 ? '+' : ''}${pct(change)}`} | ${r.notInWalk} |`);
}
if (process.argv.includes('--cases')) {
  console.log('\n| case | cause | tree | rank (i) | rank (ii) | rank (iii) | min (i) | min (ii) | min (iii) |');
  console.log('|---|---|---|---|---|---|---|---|---|');
  for (const r of results) {
    const k = (p: keyof typeof r.rank) => r.rank[p] ?? '-';
    console.log(`| ${r.caseId} | ${r.cause} | ${r.treeId} | ${k('tree-priors')} | ${k('learned')} | ${k('most-likely-first')} | ${r.minutes['tree-priors']} | ${r.minutes.learned} | ${r.minutes['most-likely-first']} |`);
  }
}
