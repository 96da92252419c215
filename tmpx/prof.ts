import { compileRulebook, evaluateCompiled } from '../src/lib/diagnosis/evaluate';
import { planNextQuestions } from '../src/lib/diagnosis/next-question';
import { sumLogOdds } from '../src/lib/diagnosis/rank';
import { makeRandomRulebook, makeRandomFacts, createRng } from '../tests/unit/diagnosis/factories';
const rb = makeRandomRulebook(5); const c = compileRulebook(rb); const rng = createRng(7);
const maps = Array.from({ length: 300 }, () => new Map(Object.entries(makeRandomFacts(rb, rng, 0.3)).filter(e => e[1] !== null)) as Map<string, any>);
const fired = maps.map(m => evaluateCompiled(c, m));
const ex = new Set<string>();
for (let k = 0; k < 20; k++) { const t = performance.now(); for (let i = 0; i < 300; i++) planNextQuestions(c, { facts: maps[i], fired: fired[i], logOdds: sumLogOdds(c, fired[i]) }, ex); if (k % 5 == 4) console.log(((performance.now() - t) * 1000 / 300).toFixed(1), 'µs'); }
