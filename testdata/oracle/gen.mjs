// gen.mjs writes cases.json: uniform-annuity cases computed by the open
// reference library `financial` (a port of numpy-financial), for
// plan/oracle_test.go to run through cairn's engine. Run it from this
// directory after `npm ci`:
//
//	npm ci && node gen.mjs
//
// It is deterministic: a fixed seed drives a small PRNG written here
// (mulberry32; Math.random is never used), every object is built with its
// keys in a fixed order, and numbers are written in JavaScript's default
// number-to-string form, which reads back to the same float64. Running it
// twice writes byte-identical files.
//
// The library's sign convention: negative is money paid in (a deposit or an
// opening balance), positive is money received. Its governing equation is
//
//	fv + pv(1+r)^n + pmt(1 + r·w)((1+r)^n − 1)/r = 0,   w = 1 for begin, 0 for end,
//
// with r the rate per payment period. Every case here is a saver's: pv ≤ 0,
// pmt ≤ 0 and fv ≥ 0.

import { readFileSync, writeFileSync } from 'node:fs';
import { fv, pv, pmt, nper, rate, irr, PaymentDueTime } from 'financial';

const SEED = 20270105;
const GENERATOR = 'gen.mjs';
const OUT = 'cases.json';
const PER_FUNCTION = 450; // 5 functions × 450 = 2,250 cases, n ≤ 600
const LONG_RATE = 50; // and 50 rate cases with n beyond 600, up to cairn's horizon
const IRR = 100; // and 100 irr cases: a saver's irregular monthly flows (plan/earned_oracle_test.go)

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
const int = (lo, hi) => lo + Math.floor(rand() * (hi - lo + 1)); // uniform integer in [lo, hi]
const pick = (xs) => xs[Math.floor(rand() * xs.length)];
const cents = (x) => {
  const c = Math.round(x * 100) / 100;
  return c === 0 ? 0 : c; // never −0
};
// a log-uniform amount in [10^lo, 10^hi], to the cent
const logAmount = (lo, hi) => cents(Math.pow(10, lo + (hi - lo) * rand()));

// Payment periods. `step` is the smallest number of periods that ends on a
// month end (so a deadline month can be written); `max` the most periods a
// case with a deadline may have (n ≤ 600, and no more than cairn's 150-year
// horizon); `horizon` the periods in that horizon.
const PERIODS = [
  { freq: 'month', adj: 'monthly', perYear: 12, step: 1, max: 600, horizon: 1800 },
  { freq: 'quarter', adj: 'quarterly', perYear: 4, step: 1, max: 600, horizon: 600 },
  { freq: 'year', adj: 'yearly', perYear: 1, step: 1, max: 150, horizon: 150 },
  { freq: '2 weeks', adj: 'every 2 weeks', perYear: 26, step: 26, max: 598, horizon: 3900 },
  { freq: 'week', adj: 'weekly', perYear: 52, step: 52, max: 572, horizon: 7800 },
];
// The periods whose horizon holds more than 600 of them.
const LONG_PERIODS = PERIODS.filter((P) => P.horizon > 600);
// Compounding frequencies an annual rate may be stated at.
const COMPOUNDING = [
  { adj: 'yearly', perYear: 1 },
  { adj: 'twice a year', perYear: 2 },
  { adj: 'quarterly', perYear: 4 },
  { adj: 'monthly', perYear: 12 },
  { adj: 'weekly', perYear: 52 },
  { adj: 'daily', perYear: 365 },
];

// A rate: a nominal annual rate from −5% to 30% in steps of 0.05% (0% in
// about one case in fifty), compounded at one of several frequencies, and
// its rate per payment period as the engine sees it. When the compounding is
// the payment frequency, the goal states the nominal rate
// ("4.25% compounded monthly", which cairn reads as 0.0425/12 a month);
// otherwise it states the equivalent periodic rate ("0.3535…% per month",
// which cairn reads as that number / 100). A rate per year is written
// "compounded yearly", because cairn reads "per year" as an effective
// annual rate credited monthly. `rate` is then computed here exactly as the
// engine computes it from the text.
function drawRate(P) {
  const bp5 = rand() < 0.02 ? 0 : int(-100, 600); // units of 0.05%
  const annualPct = String(bp5 * 5 / 100);
  const sameAsPayment = rand() < 0.5;
  const comp = sameAsPayment ? { adj: P.adj, perYear: P.perYear } : pick(COMPOUNDING);
  const annual = `${annualPct}% compounded ${comp.adj}`;
  if (comp.perYear === P.perYear) {
    const x = Number(annualPct) / 100;
    return { annual, text: annual, rate: x / P.perYear };
  }
  const per = Math.pow(1 + Number(annualPct) / 100 / comp.perYear, comp.perYear / P.perYear) - 1;
  const pct = String(per * 100);
  if (/e/i.test(pct)) throw new Error(`rate ${pct} would be written with an exponent`);
  const text = P.perYear === 1 ? `${pct}% compounded yearly` : `${pct}% per ${P.freq}`;
  return { annual, text, rate: Number(pct) / 100 };
}

// The most periods at rate r that keep the growth (1+r)^n within
// [1e-3, 1e4], so that amounts stay sensible; at least one step.
function maxPeriods(P, r, top = P.max) {
  let m = top;
  if (r > 0) m = Math.min(m, Math.floor(Math.log(1e4) / Math.log1p(r)));
  if (r < 0) m = Math.min(m, Math.floor(Math.log(1e-3) / Math.log1p(r)));
  return Math.max(P.step, m - (m % P.step));
}
const drawN = (P, r) => P.step * int(1, maxPeriods(P, r) / P.step);

// Money paid in, as the library signs it: an opening balance of 100 to
// 1,000,000 and a deposit of 10 to 10,000 a period, each zero now and then.
function drawFlows({ needPv = false, needPmt = false } = {}) {
  let b = rand() < 0.1 && !needPv ? 0 : -logAmount(2, 6);
  let a = rand() < 0.1 && !needPmt ? 0 : -logAmount(1, 4);
  if (b === 0 && a === 0) b = -logAmount(2, 6);
  return { pv: b === 0 ? 0 : b, pmt: a === 0 ? 0 : a };
}

const when = () => (rand() < 0.5 ? 'end' : 'begin');
const due = (w) => (w === 'begin' ? PaymentDueTime.Begin : PaymentDueTime.End);
const num = (x) => (Number.isFinite(x) ? x : null); // NaN and ±Infinity as null
const sensible = (x) => Number.isFinite(x) && Math.abs(x) <= 1e10;

function head(fn, P, w, R) {
  return { fn, freq: P.freq, when: w, annual: R.annual, rate_text: R.text };
}

const makers = {
  // fv(rate, nper, pmt, pv, when)
  fv() {
    const P = pick(PERIODS), w = when(), R = drawRate(P);
    const n = drawN(P, R.rate);
    const { pv: b, pmt: a } = drawFlows();
    const f = fv(R.rate, n, a, b, due(w));
    if (!sensible(f)) return null;
    return { ...head('fv', P, w, R), rate: R.rate, nper: n, pmt: a, pv: b, result: num(f) };
  },
  // pv(rate, nper, pmt, fv, when), with fv the cent-rounded future value of
  // an opening balance drawn here, so that an opening balance is needed.
  pv() {
    const P = pick(PERIODS), w = when(), R = drawRate(P);
    const n = drawN(P, R.rate);
    const { pv: b, pmt: a } = drawFlows({ needPv: true });
    const f = cents(fv(R.rate, n, a, b, due(w)));
    if (!sensible(f)) return null;
    const p = pv(R.rate, n, a, f, due(w));
    if (!(p <= -1)) return null;
    return { ...head('pv', P, w, R), rate: R.rate, nper: n, pmt: a, fv: f, result: num(p) };
  },
  // pmt(rate, nper, pv, fv, when), with fv made from a deposit drawn here.
  pmt() {
    const P = pick(PERIODS), w = when(), R = drawRate(P);
    const n = drawN(P, R.rate);
    const { pv: b, pmt: a } = drawFlows({ needPmt: true });
    const f = cents(fv(R.rate, n, a, b, due(w)));
    if (!sensible(f)) return null;
    const p = pmt(R.rate, n, b, f, due(w));
    if (!(p <= -0.01)) return null;
    return { ...head('pmt', P, w, R), rate: R.rate, nper: n, pv: b, fv: f, result: num(p) };
  },
  // nper(rate, pmt, pv, fv, when), with fv the cent-rounded value after a
  // fractional number of periods drawn here; only goals whose balance grows
  // and starts below the target.
  nper() {
    const P = pick(PERIODS), w = when(), R = drawRate(P);
    const top = maxPeriods(P, R.rate);
    const t = 0.5 + (top - 0.5) * rand();
    const { pv: b, pmt: a } = drawFlows();
    if (a === 0 && R.rate === 0) return null;
    const f = cents(fv(R.rate, t, a, b, due(w)));
    if (!sensible(f) || !(f >= -b + 1) || !(fv(R.rate, 1, a, b, due(w)) > -b)) return null;
    const k = nper(R.rate, a, b, f, due(w));
    if (!(k > 0 && k <= P.max)) return null;
    return { ...head('nper', P, w, R), rate: R.rate, pmt: a, pv: b, fv: f, result: num(k) };
  },
  // rate(nper, pmt, pv, fv, when) with the library's defaults (guess 0.1,
  // tol 1e-6, maxIter 100); fv is the cent-rounded value at the rate `made`,
  // drawn here. The library's NaN is written as null.
  //
  // A long case (n from 601 to the horizon) is where Newton's method from
  // the guess 0.1 a period may run out of iterations before it reaches the
  // root, and the library returns NaN.
  rate(long = false) {
    const P = pick(long ? LONG_PERIODS : PERIODS), w = when(), R = drawRate(P);
    let n;
    if (!long) {
      n = drawN(P, R.rate);
    } else {
      const top = maxPeriods(P, R.rate, P.horizon);
      const lo = Math.ceil(601 / P.step);
      if (top / P.step < lo) return null;
      n = P.step * int(lo, top / P.step);
    }
    const { pv: b, pmt: a } = drawFlows();
    const f = cents(fv(R.rate, n, a, b, due(w)));
    if (!sensible(f) || !(f > 0)) return null;
    const r = rate(n, a, b, f, due(w));
    return { ...head('rate', P, w, R), made: R.rate, nper: n, pmt: a, pv: b, fv: f, result: num(r) };
  },
};

const cases = [];
for (const fn of ['fv', 'pv', 'pmt', 'nper', 'rate']) {
  let made = 0;
  while (made < PER_FUNCTION) {
    const c = makers[fn]();
    if (c === null) continue;
    cases.push({ id: cases.length + 1, ...c });
    made++;
  }
}
for (let made = 0; made < LONG_RATE; ) {
  const c = makers.rate(true);
  if (c === null) continue;
  cases.push({ id: cases.length + 1, ...c });
  made++;
}

// irr(values) with the library's defaults (guess 0.1, tol 1e-6, maxIter
// 100), on a saver's months: values[0] is the opening balance paid in, each
// later value one month's money paid in (a level deposit plus, now and then,
// a one-time amount in or a smaller one out, so that no month takes money
// out), and the last also holds the balance, the value at a rate from 0% to
// 15% a year compounded monthly, to the cent. `n` is the number of months.
// Generated after every other case, so that those are unchanged.
for (let made = 0; made < IRR; ) {
  const n = int(12, 120);
  const j = int(0, 300) / 20 / 100 / 12; // 0% to 15% a year, monthly
  const b = logAmount(2, 5);
  const a = logAmount(1, 3);
  const values = [-b];
  let bal = b;
  for (let k = 1; k <= n; k++) {
    let x = a;
    const u = rand();
    if (u < 0.2) x = cents(x + logAmount(1, 3));
    else if (u < 0.3) x = cents(x - a * rand());
    bal = bal * (1 + j) + x;
    values.push(x === 0 ? 0 : -x);
  }
  const f = cents(bal);
  values[n] = cents(values[n] + f);
  const r = irr(values);
  if (!Number.isFinite(r)) continue;
  cases.push({ id: cases.length + 1, fn: 'irr', nper: n, made: j, balance: f, values, result: num(r) });
  made++;
}

const header = {
  library: lib.name,
  version: lib.version,
  generator: GENERATOR,
  seed: SEED,
  prng: 'mulberry32',
  convention:
    'negative = money paid in; rate is per payment period; fv + pv(1+r)^n + pmt(1+r*w)((1+r)^n-1)/r = 0 with w = 1 for begin; result is the library call on the other fields (null for NaN); for fn rate, made is the rate fv was computed at',
  count: cases.length,
};
let out = '{\n';
for (const [k, v] of Object.entries(header)) out += `  ${JSON.stringify(k)}: ${JSON.stringify(v)},\n`;
out += '  "cases": [\n';
out += cases.map((c) => '    ' + JSON.stringify(c)).join(',\n');
out += '\n  ]\n}\n';
writeFileSync(new URL('./' + OUT, import.meta.url), out);
console.log(`${OUT}: ${cases.length} cases from ${lib.name} ${lib.version}, seed ${SEED}`);
