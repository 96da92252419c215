import { compileRulebook } from '../src/lib/diagnosis/evaluate';
import { makeRandomRulebook, makeCoolingRulebook } from '../tests/unit/diagnosis/factories';
for (const rb of [makeRandomRulebook(5), makeCoolingRulebook()]) {
const c = compileRulebook(rb);
let total = 0, leaves = 0;
for (const o of rb.observations) { const n = c.ruleIndicesByObservation.get(o.key)!.length; const k = o.kind === 'boolean' ? 2 : o.kind === 'enum' ? o.values.length : o.bins.length; total += n * k; }
console.log('predicate evals per look-ahead', total, 'avg facts per rule', c.rules.reduce((s, r) => s + r.facts.length, 0) / c.rules.length);
}
