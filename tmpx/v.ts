import { readFileSync } from 'node:fs';
import { loadRulebookFromDir } from '../src/lib/diagnosis/load';
import { createDiagnoser } from '../src/lib/diagnosis';
const rb = loadRulebookFromDir('rules');
const vocab = JSON.parse(readFileSync('/work/shared/contract/vocabulary.json', 'utf8'));
for (const [key, v] of Object.entries<any>(vocab.observations)) {
  const o: any = rb.observations.find(o => o.key === key);
  if (!o) { console.log('MISSING obs', key); continue; }
  if (o.kind !== v.kind) console.log('KIND', key, o.kind, v.kind);
  if (v.values && JSON.stringify(o.values) !== JSON.stringify(v.values)) console.log('VALUES', key, o.values, v.values);
  if (v.kind === 'number' && (o.min !== v.min || o.max !== v.max || o.unit !== v.unit)) console.log('RANGE', key, o.min, o.max, o.unit, v);
}
for (const key of Object.keys(vocab.causes)) if (!rb.causes.find(c => c.key === key)) console.log('MISSING cause', key);
console.log('extra obs', rb.observations.filter(o => !(o.key in vocab.observations)).map(o => `${o.key}(${o.group})`).join(' '));
console.log('extra causes', rb.causes.filter(c => !(c.key in vocab.causes)).map(c => c.key));
// same-cause duplicate conditions
const seen = new Map();
for (const r of rb.rules) { const k = r.cause + JSON.stringify(r.conditions); if (seen.has(k)) console.log('DUP', r.key, seen.get(k)); seen.set(k, r.key); }
const d = createDiagnoser(rb);
for (const c of ['gets hot sitting in traffic, fine on the motorway', 'sweet smell inside the car and the windows fog up', 'losing water but no leaks on the drive', 'white smoke out the back all the time', "the fan doesn't come on", 'heater blows cold since the coolant was changed', 'steam from under the bonnet and the gauge is in the red']) console.log(c, '=>', JSON.stringify(d.matchComplaint(c)));
const r0 = await d.diagnose({ observations: {} });
console.log(r0.causes.map(c => `${c.key}:${c.probability}`).join(' '));
console.log(r0.nextQuestions.slice(0, 12).map(q => `${q.key}:${q.expectedGain}`).join(' '));
console.log(r0.nextQuestions.slice(-8).map(q => `${q.key}:${q.expectedGain}`).join(' '));
console.log(r0.tests.slice(0, 6).map(t => `${t.key}:${t.minutes}:${t.score}`).join(' '));
console.log('phrases', rb.observations.reduce((s, o) => s + o.phrases.length, 0));
