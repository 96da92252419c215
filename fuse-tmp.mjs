import Fuse from 'fuse.js';
const phrases = [
 ['temp_gauge','hot in traffic','high_at_idle'],['temp_gauge','overheats when idling','high_at_idle'],['temp_gauge','overheats on the motorway','high_at_speed'],['temp_gauge','runs hot','high_always'],
 ['sweet_smell','sweet smell inside','cabin'],['sweet_smell','smells sweet under the bonnet','engine_bay'],
 ['windscreen_film','windows fog up','true'],['windscreen_film','greasy film on the windscreen','true'],
 ['level_drops_between_checks','losing water','true'],['level_drops_between_checks','keeps losing coolant','true'],
 ['puddle_under_vehicle','leaks on the drive','true'],['puddle_under_vehicle','puddle under the car','true'],
 ['exhaust_smoke','white smoke all the time','white_persistent'],['exhaust_smoke','white smoke out the back','white_persistent'],['exhaust_smoke','steam from exhaust on cold mornings','white_at_cold_start_only'],
];
const items = phrases.map(([key,text,value])=>({key,text,value}));
const fuse = new Fuse(items, { keys:['text'], includeScore:true, threshold:0.4, ignoreLocation:true, ignoreFieldNorm:true, minMatchCharLength:2 });
for (const w of ['hot sitting in traffic','gets hot sitting in traffic','hot','traffic','fine on the motorway','on the motorway','sweet smell inside the car','windows fog up','the windows fog up','losing water','no leaks on the drive','leaks on the drive','white smoke out the back all the time','white smoke','smoke']) {
  console.log(JSON.stringify(w), fuse.search(w).slice(0,3).map(r=>`${r.item.text}:${r.score.toFixed(3)}`).join(' | '));
}
console.log('---- token search');
const tfuse = new Fuse(items, { keys:['text'], includeScore:true, useTokenSearch:true, threshold: 0.4, ignoreLocation: true });
for (const w of ['gets hot sitting in traffic','fine on the motorway','sweet smell inside the car','the windows fog up','losing water','no leaks on the drive','white smoke out the back all the time', 'overheeting in trafic', 'smels sweet']) {
  console.log(JSON.stringify(w), tfuse.search(w).slice(0,4).map(r=>`${r.item.text}:${r.score.toFixed(3)}`).join(' | '));
}
console.log(typeof Fuse.match, Fuse.match && Fuse.match('overheating','overheats', {includeScore:true}));
