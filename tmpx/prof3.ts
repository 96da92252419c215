import { createDiagnoser } from '../src/lib/diagnosis';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { makeRandomFacts, createRng } from '../tests/unit/diagnosis/factories';
const rb = loadRulebookFromDir('../rules'); const d = createDiagnoser(rb); const rng = createRng(7);
const inputs = Array.from({ length: 300 }, () => ({ observations: makeRandomFacts(rb, rng, 0.3) }));
for (let k = 0; k < 30; k++) { const t = performance.now(); for (const i of inputs) await d.diagnose(i, { evaluator: 'compiled' }); if (k % 10 == 9) console.log(((performance.now() - t) * 1000 / 300).toFixed(1), 'µs'); }
