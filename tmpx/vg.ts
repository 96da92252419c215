import { readFileSync } from 'node:fs';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { createDiagnoser, validateObservations } from '../src/lib/diagnosis';
const rb = loadRulebookFromDir('rules');
const d = createDiagnoser(rb);
const { cases } = JSON.parse(readFileSync('tests/vignettes/cases.json', 'utf8'));
let top1 = 0, top3 = 0;
for (const c of cases) {
  const issues = validateObservations(rb, c.observations ?? {}, c.unknown ?? []);
  if (issues.length) console.log('INVALID', c.id, issues);
  const r = await d.diagnose({ observations: c.observations ?? {}, unknown: c.unknown, complaint: c.complaint });
  const rank = r.causes.findIndex(x => x.key === c.expected);
  if (rank === 0) top1++; if (rank < 3) top3++;
  if (rank !== 0) console.log('MISS', c.id, 'expected', c.expected, 'rank', rank + 1, 'top', r.causes.slice(0, 3).map(x => `${x.key}:${x.probability}`).join(' '), c.complaint ? 'matched ' + JSON.stringify(r.matched.map(m => [m.key, m.value])) : '');
}
console.log('cases', cases.length, 'top1', top1, 'top3', top3);
