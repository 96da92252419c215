import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { createDiagnoser } from '../src/lib/diagnosis';
const rb = loadRulebookFromDir('rules');
const d = createDiagnoser(rb);
import { readFileSync } from 'node:fs';
const c = JSON.parse(readFileSync('tests/vignettes/cases.json','utf8')).cases.filter((x: any) => x.complaint);
for (const x of c) console.log(x.id, JSON.stringify(d.matchComplaint(x.complaint).map(m => [m.key, m.value, m.from, +m.score.toFixed(3)])));
