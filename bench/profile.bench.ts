/**
 * Profile speed, every figure a ratio against a baseline run in this same script
 * (never a timed unit test). Run: `npm run bench:profile` (add `--quick` for a short run).
 *
 * 1. Batch kernel on the one-board, three-load benchmark network with per-interval load
 *    impedances (525,600 intervals), against
 *      - a NumPy-vectorised closed-form solve of the same network (Debian python3-numpy;
 *        the script checks that both give the same line and neutral currents), goal ≥ 3×;
 *      - a per-interval mathjs matrix solve (lusolve on the nodal equations), goal ≥ 1000×.
 * 2. `trivar profile` end to end on a generated year of 1-minute data for the 30-load
 *    example board (CSV parse included): wall time, CPU time and peak memory of the process.
 *    Goals: < 3 s wall, < 500 MB. On a shared machine the wall time depends on the load
 *    average, printed beside it.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import { create, complexDependencies, lusolveDependencies, addDependencies, divideDependencies, type FactoryFunctionMap, type MathArray, type Complex } from 'mathjs';
import { compileBatchNetwork, normaliseBoard, parseBoard, type DriverColumns, type DriverSpec, type Board, type IntervalFigures } from '../packages/core/src/index.js';
import { solveLinearClosedForm } from '../packages/core/src/profile/linearClosedForm.js';


/** Figures on shared memory, so two worker threads can each fill half. */
function sharedFigures(n: number): IntervalFigures {
  const col = () => new Float64Array(new SharedArrayBuffer(8 * n));
  return { count: n, lineA: [col(), col(), col()], neutralA: col(), phaseV: [col(), col(), col()], lineToLineV: [col(), col(), col()], phaseW: [col(), col(), col()], phaseVar: [col(), col(), col()], unbalancePercent: col(), lineDeviationPercent: col() };
}

if (!isMainThread) {
  // Worker: solve its slice of the shared columns each time the main thread asks.
  const job = workerData as { board: Board; drivers: DriverSpec[]; columns: DriverColumns; figures: IntervalFigures; from: number; to: number };
  const net = compileBatchNetwork(job.board, job.drivers);
  parentPort!.on('message', (m: string) => {
    if (m === 'stop') process.exit(0);
    solveLinearClosedForm(net, job.columns, job.figures, job.from, job.to);
    parentPort!.postMessage('done');
  });
} else await main();

async function main(): Promise<void> {
  const quick = process.argv.includes('--quick');
  const N = quick ? 52_560 : 525_600;
  const fmt = (x: number) => (x >= 1e5 ? x.toExponential(2) : x.toFixed(x >= 100 ? 0 : 1));
  const load = () => loadavg()[0]!.toFixed(1);

  // The benchmark network of bench/solver.bench.ts, its loads as constant impedances.
  const board = normaliseBoard(
    parseBoard({
      supply: { system: 'three-phase-4wire', voltage: { lineToLine: 400 }, frequencyHz: 50, transformer: { kVA: 250, impedancePercent: 4, xOverR: 3 } },
      feeder: { line: { r: 0.02, x: 0.01 }, neutral: { r: 0.03, x: 0.01 } },
      loads: [
        { name: 'ovens', connection: 'A-N', kW: 9, pf: 0.98, model: 'constant-impedance' },
        { name: 'lights', connection: 'B-N', kW: 3, pf: 0.95, model: 'constant-impedance' },
        { name: 'hoist', connection: 'C-N', kW: 5, pf: 0.8, model: 'constant-impedance' },
      ],
    }),
  );

  // Per-interval scale of each load's rating (a deterministic invented pattern).
  let seed = 12345;
  const random = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  const scales = board.loads.map(() => {
    const x = new Float64Array(new SharedArrayBuffer(8 * N));
    for (let i = 0; i < N; i++) x[i] = 0.05 + 1.1 * random();
    return x;
  });
  const rated = board.loads.map((l) => l.branches[0]!.sNominal);
  const columns: DriverColumns = { count: N, re: scales, im: scales.map(() => new Float64Array(new SharedArrayBuffer(8 * N))) };
  const drivers = board.loads.map((_, l) => ({ name: board.loads[l]!.name, loads: [{ load: l, coefficient: rated[l]! }] }));

  console.log(`trivar profile benchmark${quick ? ' (quick)' : ''} — load average ${load()} on ${N.toLocaleString('en-US')} intervals`);
  console.log('');
  console.log('1. batch kernel, one board, three loads, per-interval load impedances (intervals per second)');
  const net = compileBatchNetwork(board, drivers);
  const figures = sharedFigures(N);
  let path = '';
  const kernelTimes: number[] = [];
  for (let round = 0; round < 7; round++) {
    const t = performance.now();
    solveLinearClosedForm(net, columns, figures);
    path = 'fused closed-form';
    kernelTimes.push(performance.now() - t);
  }
  const oneThreadRate = N / (Math.min(...kernelTimes) / 1000);
  console.log(`   batch kernel (${path}), one thread     ${fmt(oneThreadRate)} /s   (${Math.min(...kernelTimes).toFixed(0)} ms for all)`);
  // Both cores: two workers, each half of the intervals, on shared memory.
  const half = Math.ceil(N / 2);
  const workers = [0, 1].map((k) => new Worker(new URL(import.meta.url), { workerData: { board, drivers, columns, figures, from: k * half, to: Math.min(N, (k + 1) * half) } }));
  const roundTrip = () => Promise.all(workers.map((w) => new Promise<void>((resolve) => { w.once('message', () => resolve()); w.postMessage('go'); })));
  const twoTimes: number[] = [];
  for (let round = 0; round < 7; round++) {
    const t = performance.now();
    await roundTrip();
    twoTimes.push(performance.now() - t);
  }
  workers.forEach((w) => w.postMessage('stop'));
  const kernelRate = N / (Math.min(...twoTimes) / 1000);
  console.log(`   batch kernel, two worker threads         ${fmt(kernelRate)} /s   (${Math.min(...twoTimes).toFixed(0)} ms for all)`);

  // NumPy: the same closed form, vectorised over intervals. Inputs go over as raw float64 files.
  const dir = mkdtempSync(join(tmpdir(), 'trivar-profile-bench-'));
  const v0 = board.nominalLineToNeutralV;
  const y = board.loads.map((_, l) => {
    // Constant-impedance admittance conj(S)/V0² per interval.
    const re = new Float64Array(N);
    const im = new Float64Array(N);
    for (let i = 0; i < N; i++) {
      re[i] = (scales[l]![i]! * rated[l]!.re) / (v0 * v0);
      im[i] = (-scales[l]![i]! * rated[l]!.im) / (v0 * v0);
    }
    return { re, im };
  });
  // NumPy gets what the kernel gets: the driver columns (scale re, im) and each load's rating,
  // and forms the admittances inside the timed solve as the kernel does.
  scales.forEach((x, l) => {
    writeFileSync(join(dir, `a${l}re.f64`), new Uint8Array(Float64Array.from(x).buffer));
    writeFileSync(join(dir, `a${l}im.f64`), new Uint8Array(Float64Array.from(columns.im[l]!).buffer));
  });
  const z = { re: board.sourceImpedance.re + board.lineImpedance.re, im: board.sourceImpedance.im + board.lineImpedance.im };
  const py = `
  import numpy as np, time, sys, json
  d = sys.argv[1]
  A = [np.fromfile(f"{d}/a{k}re.f64") + 1j*np.fromfile(f"{d}/a{k}im.f64") for k in range(3)]
  K = np.array(${JSON.stringify(rated.map((r) => [r.re, r.im]))})
  K = K[:,0] + 1j*K[:,1]
  V0 = ${v0}
  E = np.array(${JSON.stringify(board.emf.map((e) => [e.re, e.im]))})
  E = E[:,0] + 1j*E[:,1]
  Z = complex(${z.re}, ${z.im}); Yn = 1/complex(${board.neutralImpedance.re}, ${board.neutralImpedance.im})
  a = complex(-0.5, ${board.sequence === 'ABC' ? '' : '-'}np.sqrt(3)/2)
  def solve():
      # The same figures the batch kernel writes: line, neutral, phase-voltage magnitudes, phase P and Q, |V2|/|V1|.
      Y = [np.conj(A[k]*K[k])/(V0*V0) for k in range(3)]
      Yp = [Y[k]/(1 + Z*Y[k]) for k in range(3)]
      VN = sum(Yp[k]*E[k] for k in range(3)) / (Yp[0] + Yp[1] + Yp[2] + Yn)
      I = [Yp[k]*(E[k] - VN) for k in range(3)]
      B = [E[k] - Z*I[k] for k in range(3)]
      V = [B[k] - VN for k in range(3)]
      S = [V[k]*np.conj(I[k]) for k in range(3)]
      V1 = B[0] + a*B[1] + a*a*B[2]
      V2 = B[0] + a*a*B[1] + a*B[2]
      return [np.abs(i) for i in I], np.abs(Yn*VN), [np.abs(v) for v in V], [s.real for s in S], [s.imag for s in S], 100*np.abs(V2)/np.abs(V1)
  best = 1e9
  for _ in range(7):
      t = time.perf_counter(); IL, IN, *_ = solve(); best = min(best, time.perf_counter() - t)
  np.concatenate(IL + [IN]).tofile(f"{d}/numpy_out.f64")
  print(json.dumps({"seconds": best, "numpy": np.__version__}))
  `;
  writeFileSync(join(dir, 'closed_form.py'), py.replace(/^ {2}/gm, ''));
  const python = ['/usr/bin/python3', 'python3'].find((p) => spawnSync(p, ['-c', 'import numpy'], { stdio: 'ignore' }).status === 0);
  let numpyRate: number | null = null;
  if (!python) console.log('   NumPy: not available (apt-get install python3-numpy)');
  else {
    const r = spawnSync(python, [join(dir, 'closed_form.py'), dir], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(r.stderr);
    const { seconds, numpy } = JSON.parse(r.stdout) as { seconds: number; numpy: string };
    numpyRate = N / seconds;
    // Same answers: line and neutral current magnitudes.
    const { readFileSync } = await import('node:fs');
    const out = new Float64Array(new Uint8Array(readFileSync(join(dir, 'numpy_out.f64'))).buffer);
    let worst = 0;
    for (let k = 0; k < 4; k++)
      for (let i = 0; i < N; i++) {
        const ours = k < 3 ? figures.lineA[k]![i]! : figures.neutralA[i]!;
        worst = Math.max(worst, Math.abs(ours - out[k * N + i]!) / Math.max(1, Math.abs(out[k * N + i]!)));
      }
    console.log(`   NumPy ${numpy} vectorised closed form        ${fmt(numpyRate)} /s   (same line and neutral currents to ${worst.toExponential(1)} relative)`);
  }

  // mathjs: the nodal equations of the same network solved per interval with lusolve.
  const math = create({ complexDependencies, lusolveDependencies, addDependencies, divideDependencies } as FactoryFunctionMap);
  const mathjsCount = quick ? 300 : 2000;
  const yl = { re: z.re / (z.re ** 2 + z.im ** 2), im: -z.im / (z.re ** 2 + z.im ** 2) };
  const yn = { re: board.neutralImpedance.re / (board.neutralImpedance.re ** 2 + board.neutralImpedance.im ** 2), im: -board.neutralImpedance.im / (board.neutralImpedance.re ** 2 + board.neutralImpedance.im ** 2) };
  const c = (re: number, im: number) => math.complex(re, im);
  const mathjsStart = performance.now();
  let mathjsCheck = 0;
  for (let i = 0; i < mathjsCount; i++) {
    // Unknowns: bus A, B, C, neutral bar. Norton sources Y_line·E at the buses.
    const a: Complex[][] = Array.from({ length: 4 }, () => Array.from({ length: 4 }, () => c(0, 0)));
    const b: Complex[][] = Array.from({ length: 4 }, () => [c(0, 0)]);
    for (let k = 0; k < 3; k++) {
      const yk = c(y[k]!.re[i]!, y[k]!.im[i]!);
      a[k]![k] = math.add(c(yl.re, yl.im), yk) as Complex;
      a[k]![3] = math.complex(-yk.re, -yk.im);
      a[3]![k] = math.complex(-yk.re, -yk.im);
      a[3]![3] = math.add(a[3]![3]!, yk) as Complex;
      b[k]![0] = math.complex(yl.re * board.emf[k]!.re - yl.im * board.emf[k]!.im, yl.re * board.emf[k]!.im + yl.im * board.emf[k]!.re);
    }
    a[3]![3] = math.add(a[3]![3]!, c(yn.re, yn.im)) as Complex;
    const x = math.lusolve(a as unknown as MathArray, b as unknown as MathArray) as unknown as Complex[][];
    const va = x[0]![0]!;
    mathjsCheck = Math.max(mathjsCheck, Math.abs(Math.hypot(yl.re * (board.emf[0]!.re - va.re) - yl.im * (board.emf[0]!.im - va.im), yl.re * (board.emf[0]!.im - va.im) + yl.im * (board.emf[0]!.re - va.re)) - figures.lineA[0]![i]!) / figures.lineA[0]![i]!);
  }
  const mathjsRate = mathjsCount / ((performance.now() - mathjsStart) / 1000);
  console.log(`   mathjs lusolve per interval (${mathjsCount} intervals) ${fmt(mathjsRate)} /s   (line A current agrees to ${mathjsCheck.toExponential(1)})`);
  console.log(`   ratios: kernel (two threads) / NumPy ${numpyRate ? (kernelRate / numpyRate).toFixed(1) : '-'}x (goal >= 3x; one thread ${numpyRate ? (oneThreadRate / numpyRate).toFixed(1) : '-'}x), kernel / mathjs ${(kernelRate / mathjsRate).toFixed(0)}x (goal >= 1000x; one thread ${(oneThreadRate / mathjsRate).toFixed(0)}x)`);

  if (process.argv.includes('--kernel-only')) return;
  console.log('');
  console.log('2. trivar profile end to end: a year of 1-minute data, 30-load 4-wire board (examples/quay-street-flats.yaml)');
  const csv = join(dir, 'quay-street.csv');
  spawnSync(process.execPath, ['scripts/generate-profile-example.mjs', csv, ...(quick ? ['--days', '36'] : [])], { stdio: 'inherit' });
  const time = existsSync('/usr/bin/time') ? '/usr/bin/time' : null;
  const runs = quick ? 1 : 3;
  for (const extra of [[], ['--bank']]) {
    const walls: number[] = [];
    let rss = 0;
    let cpu = 0;
    for (let k = 0; k < runs; k++) {
      const args = ['packages/cli/bin/trivar.js', 'profile', 'examples/quay-street-flats.yaml', '--data', csv, '--time-zone', 'Europe/Dublin', ...extra];
      const before = load();
      const t = performance.now();
      const r = time ? spawnSync(time, ['-f', '%M %U %S', process.execPath, ...args], { encoding: 'utf8' }) : spawnSync(process.execPath, args, { encoding: 'utf8' });
      walls.push(performance.now() - t);
      if (r.status !== 0) throw new Error(r.stderr);
      if (time) {
        const [m, u, s] = r.stderr.trim().split('\n').at(-1)!.split(' ').map(Number);
        rss = Math.max(rss, m! / 1024);
        cpu = u! + s!;
      }
      void before;
    }
    const wall = Math.min(...walls) / 1000;
    console.log(`   trivar profile ${extra.join(' ').padEnd(7)} ${wall.toFixed(2)} s wall (best of ${runs}, load average ${load()}), ${cpu.toFixed(2)} s CPU, peak ${rss.toFixed(0)} MB   (goals < 3 s, < 500 MB)`);
  }
}
