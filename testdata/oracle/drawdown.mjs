// drawdown.mjs writes drawdown.json: the capital a level income needs,
// computed by the open reference library `financial` (pinned in
// package.json), for plan/oracle_test.go to check cairn's capital solver
// against. Run it from this directory after `npm ci`:
//
//	npm ci && node drawdown.mjs
//
// Deterministic as gen.mjs is: a fixed seed drives mulberry32, keys are in a
// fixed order, numbers in JavaScript's default form. Each case is a
// drawdown: withdrawals of `pmt` every month for `nper` months, at the start
// or end of each, leaving `fv` after the last, at the monthly rate `rate`
// (the goal states it as the nominal rate compounded monthly). The capital
// needed one period before the first withdrawal's period begins is −pv:
// pv(rate, nper, pmt, fv, when), positive pmt and fv being money received.

import { readFileSync, writeFileSync } from 'node:fs';
import { pv, PaymentDueTime } from 'financial';

const SEED = 20270115;
const OUT = 'drawdown.json';
const COUNT = 200;

const lib = JSON.parse(readFileSync(new URL('./node_modules/financial/package.json', import.meta.url), 'utf8'));

// mulberry32: a 32-bit PRNG (public domain, by Tommy Ettinger); uniform in [0, 1).
function mulberry32(a) {
  return function () {
    a |= 0;
    a = (a + 0x6d2b79f5) | 0;
    let t = Math.imul(a ^ (a >>> 15), 1 | a);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
const rand = mulberry32(SEED);
const int = (lo, hi) => lo + Math.floor(rand() * (hi - lo + 1));
const cents = (x) => {
  const c = Math.round(x * 100) / 100;
  return c === 0 ? 0 : c;
};
const logAmount = (lo, hi) => cents(Math.pow(10, lo + (hi - lo) * rand()));

const cases = [];
for (let id = 1; id <= COUNT; id++) {
  const bp5 = int(0, 240); // 0% to 12% a year in steps of 0.05%
  const annualPct = String(bp5 * 5 / 100);
  const rateText = `${annualPct}% compounded monthly`;
  const r = Number(annualPct) / 100 / 12;
  const n = int(12, 480);
  const w = rand() < 0.5 ? 'end' : 'begin';
  const a = logAmount(2, 4);
  const f = rand() < 0.3 ? 0 : logAmount(3, 6);
  const p = pv(r, n, a, f, w === 'begin' ? PaymentDueTime.Begin : PaymentDueTime.End);
  cases.push(`    {"id":${id},"fn":"pv","freq":"month","when":"${w}","rate_text":"${rateText}","rate":${r},"nper":${n},"pmt":${a},"fv":${f},"result":${Number.isFinite(p) ? p : null}}`);
}
const head = `{
  "library": "${lib.name}",
  "version": "${lib.version}",
  "generator": "drawdown.mjs",
  "seed": ${SEED},
  "prng": "mulberry32",
  "convention": "positive pmt and fv are money received (withdrawals, the amount left); the capital needed is -result",
  "count": ${COUNT},
  "cases": [
`;
writeFileSync(OUT, head + cases.join(',\n') + '\n  ]\n}\n');
