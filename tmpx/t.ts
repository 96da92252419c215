import { createDiagnoser } from '../src/lib/diagnosis/index';
import { makeCoolingRulebook } from '../tests/unit/diagnosis/factories';
const d = createDiagnoser(makeCoolingRulebook());
for (const c of ['gets hot sitting in traffic, fine on the motorway', 'sweet smell inside the car and the windows fog up', 'losing water but no leaks on the drive', 'white smoke out the back all the time', "the fan doesn't come on and it overheets in trafic", 'not hot in traffic but overheats on the motorway', 'no heat from the heater', 'fan comes on fine']) {
  console.log(c, '=>', JSON.stringify(d.matchComplaint(c)));
}
const r = await d.diagnose({ observations: { temp_gauge: 'high_at_idle', fan_runs_when_hot: false }, unknown: ['fan_circuit_test'] });
console.log(JSON.stringify(r, null, 1).slice(0, 3000));
console.log(r.nextQuestions.map(q => `${q.key}:${q.expectedGain}`).join(' '));
const r0 = await d.diagnose({ observations: {} });
console.log(r0.causes.map(c => `${c.key}:${c.probability}`).join(' '));
console.log(r0.nextQuestions.map(q => `${q.key}:${q.expectedGain}`).join(' '));
console.log(r0.tests.map(q => `${q.key}:${q.score}`).join(' '));
