import { createDiagnoser, makeSyntheticRulebook } from '../src/lib/diagnosis';
import { makeRandomRulebook, makeRandomFacts, createRng } from '../tests/unit/diagnosis/factories';
const rb = makeSyntheticRulebook(makeRandomRulebook(5), 10); const d = createDiagnoser(rb); const rng = createRng(7);
const inputs = Array.from({ length: 100 }, () => ({ observations: makeRandomFacts(rb, rng, 0.3) }));
for (let k = 0; k < 10; k++) { const t = performance.now(); for (const i of inputs) await d.diagnose(i, { evaluator: 'compiled' }); if (k % 3 == 2) console.log(((performance.now() - t) * 1000 / 100).toFixed(1), 'µs'); }
