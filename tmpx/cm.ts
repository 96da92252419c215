import { readFileSync } from 'node:fs';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { createDiagnoser } from '../src/lib/diagnosis';
const rb = loadRulebookFromDir('rules'); const d = createDiagnoser(rb);
const complaints = JSON.parse(readFileSync('tests/vignettes/cases.json', 'utf8')).cases.filter((c: any) => c.complaint).map((c: any) => c.complaint);
const long = complaints.join('. ').repeat(3).slice(0, 2000);
for (let k = 0; k < 3; k++) {
  let t = performance.now(); for (let i = 0; i < 20; i++) for (const c of complaints) d.matchComplaint(c);
  console.log('per complaint µs', ((performance.now() - t) * 1000 / (20 * complaints.length)).toFixed(0));
  t = performance.now(); for (let i = 0; i < 5; i++) d.matchComplaint(long);
  console.log('2000-char complaint µs', ((performance.now() - t) * 1000 / 5).toFixed(0));
}
