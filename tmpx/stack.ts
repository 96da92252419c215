import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { compileRulebook, toFactVector } from '../src/lib/diagnosis/evaluate';
import { listAnswerOptions } from '../src/lib/diagnosis/next-question';
const rb = loadRulebookFromDir('rules'); const c = compileRulebook(rb);
let n = 0;
for (const o of rb.observations) {
  const vals = o.kind === 'number' ? [...new Set([o.min, o.max, ...o.bins.map(b => b.value), 0.25, 1, 3, 10])] : listAnswerOptions(o).map(x => x.value);
  for (const v of vals) {
    const f = toFactVector(c, [[o.key, v]]);
    const fired = c.rules.filter(r => r.facts.length === 1 && r.facts[0] === o.key && r.predicate(f));
    const byCause = new Map<string, string[]>();
    for (const r of fired) byCause.set(r.rule.cause, [...(byCause.get(r.rule.cause) ?? []), `${r.key}(${r.lr})`]);
    for (const [cause, keys] of byCause) if (keys.length > 1) { n++; console.log(`${o.key}=${v} → ${cause}: ${keys.join(', ')}`); }
  }
}
console.log('stacked', n);
