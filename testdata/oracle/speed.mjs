// speed.mjs times the reference library's rate() on 10,000 seeded
// uniform-annuity rate problems and writes them, with its answers and its
// time, to the JSON file named by its argument, for internal/ratespeed to
// time cairn on the same problems. Run from this directory after `npm ci`:
//
//	node speed.mjs /tmp/problems.json
//
// Each problem is made at a known rate (so a root exists): a saver's
// opening balance and level deposits, end or start timing, n up to 600,
// 1 to 52 periods a year, annual rates from -5% to 30%.

import { writeFileSync } from 'node:fs';
import { fv, rate, PaymentDueTime } from 'financial';

const SEED = 20271201;
const N = 10000;

function mulberry32(a) { // public-domain 32-bit PRNG; uniform in [0, 1)
  return function () {
    a |= 0;
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const rnd = mulberry32(SEED);
const perYear = [1, 2, 4, 12, 26, 52];
const problems = [];
for (let k = 0; k < N; k++) {
  const m = perYear[Math.floor(rnd() * perYear.length)];
  const annual = -0.05 + rnd() * 0.35;
  const r = Math.pow(1 + annual, 1 / m) - 1;
  const n = 1 + Math.floor(rnd() * 600);
  const pv = -Math.round(rnd() * 50000 * 100) / 100;
  const pmt = -Math.round((1 + rnd() * 2000) * 100) / 100;
  const when = rnd() < 0.5 ? 'end' : 'begin';
  const f = fv(r, n, pmt, pv, when === 'begin' ? PaymentDueTime.Begin : PaymentDueTime.End);
  problems.push({ n, pv, pmt, fv: f, when, made: r });
}

function timeIt() {
  const out = new Array(N);
  const t0 = process.hrtime.bigint();
  for (let k = 0; k < N; k++) {
    const p = problems[k];
    out[k] = rate(p.n, p.pmt, p.pv, p.fv, p.when === 'begin' ? PaymentDueTime.Begin : PaymentDueTime.End);
  }
  return [Number(process.hrtime.bigint() - t0) / 1e9, out];
}
timeIt(); // warm up the JIT
let best = Infinity, answers;
for (let rep = 0; rep < 5; rep++) {
  const [s, out] = timeIt();
  if (s < best) { best = s; answers = out; }
}
let converged = 0;
for (let k = 0; k < N; k++) {
  if (Number.isFinite(answers[k]) && Math.abs(answers[k] - problems[k].made) < 1e-6) converged++;
  problems[k].library = Number.isFinite(answers[k]) ? answers[k] : null;
}
writeFileSync(process.argv[2], JSON.stringify({ library: 'financial', seed: SEED, seconds: best, converged, problems }));
console.log(`financial rate(): ${N} problems in ${(best * 1e3).toFixed(2)} ms, ${(N / best).toFixed(0)} a second; converged to the made rate on ${converged}`);
