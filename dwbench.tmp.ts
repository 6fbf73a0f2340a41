import { readFileSync } from 'node:fs';
const root = process.argv[2];
const kind = process.argv[3] ?? 'club-fwd-front-left';
const { CornerSolver } = await import(root + '/src/lib/server/kinematics/index.ts');
const c = JSON.parse(readFileSync(root + '/fixtures/' + kind + '.json', 'utf8'));
const s = new CornerSolver(c);
const SW = { sweep: 'heave', from: -80, to: 80, step: 1 };
for (let i = 0; i < 3000; i++) s.run(SW);
const t: number[] = [];
for (let i = 0; i < 3000; i++) { const t0 = performance.now(); s.run(SW); t.push((performance.now() - t0) * 1000); }
t.sort((a, b) => a - b);
console.log(kind, 'median µs', t[1500].toFixed(1));
