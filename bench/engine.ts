/**
 * Engine benchmark: the moist-air engine side by side with PsychroLib (npm psychrolib, the test
 * oracle, a devDependency) in one run. Three cases, each over the same random states
 * (db −40…90 °C, rh 1…100 %, p 60…110 kPa, fixed seed):
 *   (db, wb, p) → all properties;  (db, rh, p) → all properties including the wet-bulb;
 *   (db, w, p) → wet-bulb.
 * Prints ns per state for both (median of several rounds after a warm-up), the ratio, and the
 * accuracy each achieves against a reference wet-bulb / dew point solved by bisection to 1e-12 K
 * on the same equations. Run alone with `node --import tsx bench/engine.ts`, or through
 * `npm run bench`.
 */
import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';

type Engine = typeof import('../shared-core/src/physics');
type Internals = typeof import('../shared-core/src/physics/wetbulb') &
  typeof import('../shared-core/src/physics/saturation');

interface PsychroLib {
  SI: number;
  SetUnitSystem(u: number): void;
  GetTWetBulbFromHumRatio(db: number, w: number, p: number): number;
  GetMoistAirDensity(t: number, w: number, p: number): number;
  CalcPsychrometricsFromRelHum(db: number, rh: number, p: number): number[];
  CalcPsychrometricsFromTWetBulb(db: number, wb: number, p: number): number[];
}

const N = 4096;
const WARMUP_ROUNDS = 4;
const ROUNDS = 11;

/** Park–Miller generator: the same states on every run. */
function rng(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 16807) % 2147483647;
    return s / 2147483647;
  };
}

/** Reference wet-bulb: bisection to 1e-12 K on eq 33/35 with the engine's branch rule. */
function referenceWetBulb(E: Engine, I: Internals, db: number, w: number, p: number): number {
  const pw = (p * w) / (0.621945 + w);
  const dp = pw > 0 ? E.dewPointFromVapPres(pw) : -200;
  let hi = E.satVapPres(db) >= p ? E.boilingPoint(p) : db;
  let lo = Math.max(dp, -200);
  const residual = (t: number): number => {
    const pws = I.pwsRaw(t);
    if (pws >= p) return Number.POSITIVE_INFINITY;
    return I.humRatioEq33(db, t, (0.621945 * pws) / (p - pws)) - w;
  };
  if (lo < 0 && hi > 0) {
    if (residual(0) <= 0) lo = 0;
    else hi = -Number.MIN_VALUE;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12; i++) {
    const m = 0.5 * (lo + hi);
    if (residual(m) < 0) lo = m;
    else hi = m;
  }
  return 0.5 * (lo + hi);
}

interface Timing {
  ours: number;
  theirs: number;
}

/** Median ns per state of two loops, interleaved round by round. */
function time(ours: () => number, theirs: () => number): Timing {
  let sink = 0;
  for (let r = 0; r < WARMUP_ROUNDS; r++) sink += ours() + theirs();
  const a: number[] = [];
  const b: number[] = [];
  for (let r = 0; r < ROUNDS; r++) {
    let t0 = process.hrtime.bigint();
    sink += ours();
    a.push(Number(process.hrtime.bigint() - t0) / N);
    t0 = process.hrtime.bigint();
    sink += theirs();
    b.push(Number(process.hrtime.bigint() - t0) / N);
  }
  if (Number.isNaN(sink)) console.log('(checksum NaN)');
  const med = (x: number[]): number => [...x].sort((u, v) => u - v)[x.length >> 1]!;
  return { ours: med(a), theirs: med(b) };
}

function fmt(x: number, digits = 0): string {
  return x.toFixed(digits).padStart(8);
}

function fmtErr(x: number): string {
  return `${x.toExponential(1).padStart(9)} K`;
}

/** Runs the engine benchmark and prints its figures. */
export async function benchEngine(): Promise<void> {
  // The engine is loaded with dynamic imports so that tsx links it as ES modules (close to the
  // shipped esbuild bundle, one scope) even if this file runs in CommonJS mode: tsx's per-file
  // CommonJS transform puts a property getter on every cross-module call and makes the engine
  // about 3× slower than it ships.
  const E: Engine = await import('../shared-core/src/physics');
  const I: Internals = {
    ...(await import('../shared-core/src/physics/wetbulb')),
    ...(await import('../shared-core/src/physics/saturation')),
  };
  const { humRatioFromRelHum, humRatioFromWetBulb, satVapPres, solveState, wetBulbFromHumRatio, dewPointFromVapPres } =
    E;
  const require = createRequire(import.meta.url);
  const psy = require('psychrolib') as PsychroLib;
  psy.SetUnitSystem(psy.SI);

  // States: db, rh, p drawn at random; w and wb derived with the engine.
  const random = rng(20261201);
  const db = new Float64Array(N);
  const rh = new Float64Array(N);
  const p = new Float64Array(N);
  const w = new Float64Array(N);
  const wb = new Float64Array(N);
  for (let i = 0; i < N; ) {
    const t = -40 + 130 * random();
    const r = 0.01 + 0.99 * random();
    const pp = 60_000 + 50_000 * random();
    if (r * satVapPres(t) >= 0.98 * pp) continue;
    db[i] = t;
    rh[i] = r;
    p[i] = pp;
    w[i] = humRatioFromRelHum(t, r, pp);
    wb[i] = wetBulbFromHumRatio(t, w[i]!, pp);
    i++;
  }
  const ref = new Float64Array(N);
  for (let i = 0; i < N; i++) ref[i] = referenceWetBulb(E, I, db[i]!, w[i]!, p[i]!);
  const refDp = new Float64Array(N);
  for (let i = 0; i < N; i++) refDp[i] = dewPointFromVapPres((p[i]! * w[i]!) / (0.621945 + w[i]!));

  // Accuracy (wet-bulb and dew point against the reference). PsychroLib's figures are split into
  // ordinary states and the two kinds where it legitimately or wrongly differs.
  let oursWbErr = 0;
  let oursDpErr = 0;
  let theirsWbErr = 0;
  let theirsDpErr = 0;
  let aboveBoiling = 0;
  let twoRoot = 0;
  for (let i = 0; i < N; i++) {
    const s = solveState({ db: db[i]!, rh: rh[i]! }, p[i]!);
    if (!s.ok) throw new Error(s.problem.message);
    oursWbErr = Math.max(oursWbErr, Math.abs(s.state.wb - ref[i]!));
    oursDpErr = Math.max(oursDpErr, Math.abs(s.state.dp - refDp[i]!));
    const o = psy.CalcPsychrometricsFromRelHum(db[i]!, rh[i]!, p[i]!);
    theirsDpErr = Math.max(theirsDpErr, Math.abs(o[2]! - refDp[i]!));
    const e = Math.abs(o[1]! - ref[i]!);
    if (e > 0.01) {
      if (!Number.isFinite(s.state.ws)) aboveBoiling++;
      else if (
        Math.abs(humRatioFromWetBulb(db[i]!, Math.min(o[1]!, db[i]!), p[i]!) - w[i]!) < 1e-5 ||
        Math.abs(o[1]!) < 0.01
      )
        twoRoot++;
      else theirsWbErr = Math.max(theirsWbErr, e);
    } else theirsWbErr = Math.max(theirsWbErr, e);
  }

  const dbWb = time(
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) {
        const r = solveState({ db: db[i]!, wb: wb[i]! }, p[i]!);
        if (r.ok) acc += r.state.dp + r.state.rho;
      }
      return acc;
    },
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) {
        const o = psy.CalcPsychrometricsFromTWetBulb(db[i]!, wb[i]!, p[i]!);
        acc += o[1]! + psy.GetMoistAirDensity(db[i]!, o[0]!, p[i]!);
      }
      return acc;
    },
  );
  const dbRh = time(
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) {
        const r = solveState({ db: db[i]!, rh: rh[i]! }, p[i]!);
        if (r.ok) acc += r.state.wb + r.state.rho;
      }
      return acc;
    },
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) {
        const o = psy.CalcPsychrometricsFromRelHum(db[i]!, rh[i]!, p[i]!);
        acc += o[1]! + psy.GetMoistAirDensity(db[i]!, o[0]!, p[i]!);
      }
      return acc;
    },
  );
  const dbW = time(
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) acc += wetBulbFromHumRatio(db[i]!, w[i]!, p[i]!);
      return acc;
    },
    () => {
      let acc = 0;
      for (let i = 0; i < N; i++) acc += psy.GetTWetBulbFromHumRatio(db[i]!, w[i]!, p[i]!);
      return acc;
    },
  );

  console.log(
    `moist-air engine vs PsychroLib: ${N} states (db −40…90 °C, rh 1…100 %, ` +
      `p 60…110 kPa), median of ${ROUNDS} rounds after ${WARMUP_ROUNDS} warm-up`,
  );
  console.log('case                               engine ns  PsychroLib ns   ratio');
  const row = (name: string, t: Timing) =>
    console.log(`${name.padEnd(34)} ${fmt(t.ours)}  ${fmt(t.theirs, 0).padStart(13)}  ${fmt(t.theirs / t.ours, 1)}×`);
  row('(db, wb, p) → all properties', dbWb);
  row('(db, rh, p) → all incl. wet-bulb', dbRh);
  row('(db, w, p)  → wet-bulb', dbW);
  console.log('accuracy against bisection to 1e-12 K on the same equations (max |error|):');
  console.log(
    `  wet-bulb  engine ${fmtErr(oursWbErr)} (target 1e-6 K)  ` +
      ` PsychroLib ${fmtErr(theirsWbErr)} (its tolerance 1e-3 K)`,
  );
  console.log(`  dew point engine ${fmtErr(oursDpErr)}                   PsychroLib ${fmtErr(theirsDpErr)}`);
  console.log(
    `  PsychroLib wet-bulbs off by more than 0.01 K, left out above: ${aboveBoiling} ` +
      `at or above the boiling point (its bracket walks to the dry-bulb), ${twoRoot} ` +
      `in the band near 0 °C where eq 33 and eq 35 both have a root`,
  );
  console.log(
    `goals: ≤ 300 ns per full state from (db, rh, ` +
      `p): ${dbRh.ours <= 300 ? 'met' : 'NOT met'} (${dbRh.ours.toFixed(0)} ns); ` +
      `≥ 10× PsychroLib where a wet-bulb is ` +
      `solved: ${Math.min(dbRh.theirs / dbRh.ours, dbW.theirs / dbW.ours) >= 10 ? 'met' : 'NOT met'} ` +
      `(${(dbRh.theirs / dbRh.ours).toFixed(1)}×, ${(dbW.theirs / dbW.ours).toFixed(1)}×)`,
  );
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  benchEngine().catch((err: unknown) => {
    console.error(err);
    process.exitCode = 1;
  });
}
