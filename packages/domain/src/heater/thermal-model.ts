// Lumped two-node thermal model of a vehicle warmed by a coolant heater: closed form, RK4, energy balance.
//
// Node 1 is the engine block with its coolant, node 2 the cabin (air and furnishings).
//   C1·dT1/dt = P − UA1a·(T1 − Ta) − UA12·(T1 − T2)
//   C2·dT2/dt =      UA12·(T1 − T2) − UA2a·(T2 − Ta)
// With θ = T − Ta this is θ' = A·θ + b, a linear system with constant coefficients.

export interface TwoNodeModel {
  /** Heat capacity of engine and coolant, J/K. */
  c1JPerK: number;
  /** Heat capacity of the cabin, J/K. */
  c2JPerK: number;
  /** Loss conductance engine → outside, W/K. */
  ua1aWPerK: number;
  /** Conductance engine → cabin through the heater matrix and blower, W/K. */
  ua12WPerK: number;
  /** Loss conductance cabin → outside, W/K. */
  ua2aWPerK: number;
  /** Heat delivered into node 1, W. */
  heatInputW: number;
  /** Outside temperature, °C. */
  ambientC: number;
  /** Start temperatures; both default to the outside temperature (a vehicle parked overnight). */
  initialCoolantC?: number;
  initialCabinC?: number;
}

export interface TemperatureSample {
  tSeconds: number;
  coolantC: number;
  cabinC: number;
}

type Vec2 = readonly [number, number];

function checkModel(m: TwoNodeModel): void {
  const finite = [m.c1JPerK, m.c2JPerK, m.ua1aWPerK, m.ua12WPerK, m.ua2aWPerK, m.heatInputW, m.ambientC];
  if (!finite.every(Number.isFinite)) throw new RangeError('Model parameters must be finite numbers');
  if (!(m.c1JPerK > 0 && m.c2JPerK > 0)) throw new RangeError('Heat capacities must be positive');
  if (m.ua1aWPerK < 0 || m.ua12WPerK < 0 || m.ua2aWPerK < 0) throw new RangeError('Conductances must not be negative');
}

/** The system matrix A (1/s) and input vector b (K/s) of θ' = A·θ + b. */
export function systemMatrix(m: TwoNodeModel): { a11: number; a12: number; a21: number; a22: number; b1: number; b2: number } {
  checkModel(m);
  return {
    a11: -(m.ua1aWPerK + m.ua12WPerK) / m.c1JPerK,
    a12: m.ua12WPerK / m.c1JPerK,
    a21: m.ua12WPerK / m.c2JPerK,
    a22: -(m.ua12WPerK + m.ua2aWPerK) / m.c2JPerK,
    b1: m.heatInputW / m.c1JPerK,
    b2: 0,
  };
}

export interface ClosedFormSolution {
  /** Eigenvalues of A, 1/s, both negative; the first is the faster mode. */
  eigenvalues: Vec2;
  /** Eigenvectors of A matching the eigenvalues. */
  eigenvectors: readonly [Vec2, Vec2];
  /** Mode amplitudes: θ(t) = θss + Σ coefficient_i · v_i · e^(λ_i t). */
  coefficients: Vec2;
  /** Time constants −1/λ, seconds. */
  timeConstantsSeconds: Vec2;
  steadyState: { coolantC: number; cabinC: number };
  at(tSeconds: number): TemperatureSample;
}

/**
 * Exact solution of the two-node system. A has real, distinct, negative eigenvalues whenever
 * the nodes are coupled (a12·a21 > 0 makes the discriminant positive) and the system loses heat
 * (det A > 0). Uncoupled nodes (UA12 = 0) are handled too: the eigenvectors are then the axes.
 */
export function solveTwoNodeClosedForm(m: TwoNodeModel): ClosedFormSolution {
  const { a11, a12, a21, a22, b1, b2 } = systemMatrix(m);
  const det = a11 * a22 - a12 * a21;
  if (!(det > 0)) throw new RangeError('The model has no steady state: at least one path to the outside must conduct heat');

  // Steady state θss = −A⁻¹·b.
  const ss1 = -(a22 * b1 - a12 * b2) / det;
  const ss2 = -(-a21 * b1 + a11 * b2) / det;

  const trace = a11 + a22;
  const disc = Math.max(0, (a11 - a22) ** 2 + 4 * a12 * a21);
  const fast = (trace - Math.sqrt(disc)) / 2; // most negative
  const slow = det / fast; // product of the eigenvalues is det; avoids cancellation

  const eigenvector = (lambda: number, fallback: Vec2): Vec2 => {
    // Rows of (A − λI)·v = 0 give v = (a12, λ − a11) or (λ − a22, a21); take the longer one.
    const p: Vec2 = [a12, lambda - a11];
    const q: Vec2 = [lambda - a22, a21];
    const np = Math.hypot(p[0], p[1]);
    const nq = Math.hypot(q[0], q[1]);
    const scale = Math.max(Math.abs(a11), Math.abs(a22), 1e-300);
    if (Math.max(np, nq) <= 1e-12 * scale) return fallback; // A is a multiple of I
    const v = np >= nq ? p : q;
    const n = Math.max(np, nq);
    return [v[0] / n, v[1] / n];
  };
  const v1 = eigenvector(fast, [1, 0]);
  let v2 = eigenvector(slow, [0, 1]);
  // Equal eigenvalues happen only for uncoupled, identical nodes; then any two axes will do.
  if (Math.abs(v1[0] * v2[1] - v1[1] * v2[0]) < 1e-12) v2 = [-v1[1], v1[0]];

  const d1 = (m.initialCoolantC ?? m.ambientC) - m.ambientC - ss1;
  const d2 = (m.initialCabinC ?? m.ambientC) - m.ambientC - ss2;
  // Solve [v1 v2]·c = θ(0) − θss by Cramer's rule.
  const vdet = v1[0] * v2[1] - v2[0] * v1[1];
  const k1 = (d1 * v2[1] - v2[0] * d2) / vdet;
  const k2 = (v1[0] * d2 - d1 * v1[1]) / vdet;

  return {
    eigenvalues: [fast, slow],
    eigenvectors: [v1, v2],
    coefficients: [k1, k2],
    timeConstantsSeconds: [-1 / fast, -1 / slow],
    steadyState: { coolantC: m.ambientC + ss1, cabinC: m.ambientC + ss2 },
    at(tSeconds: number): TemperatureSample {
      const e1 = k1 * Math.exp(fast * tSeconds);
      const e2 = k2 * Math.exp(slow * tSeconds);
      return {
        tSeconds,
        coolantC: m.ambientC + ss1 + e1 * v1[0] + e2 * v2[0],
        cabinC: m.ambientC + ss2 + e1 * v1[1] + e2 * v2[1],
      };
    },
  };
}

/** Right-hand side written as heat flows, independently of the matrix form above. */
function derivatives(m: TwoNodeModel, t1: number, t2: number): Vec2 {
  const toOutside1 = m.ua1aWPerK * (t1 - m.ambientC);
  const toCabin = m.ua12WPerK * (t1 - t2);
  const toOutside2 = m.ua2aWPerK * (t2 - m.ambientC);
  return [(m.heatInputW - toOutside1 - toCabin) / m.c1JPerK, (toCabin - toOutside2) / m.c2JPerK];
}

/**
 * Classical fourth-order Runge–Kutta with a fixed step. Returns samples every
 * `sampleEverySeconds` (rounded to whole steps) and always the end point.
 */
export function integrateTwoNodeRk4(
  m: TwoNodeModel,
  options: { durationSeconds: number; stepSeconds?: number; sampleEverySeconds?: number },
): TemperatureSample[] {
  checkModel(m);
  const step = options.stepSeconds ?? 5;
  const duration = options.durationSeconds;
  if (!(step > 0) || !(duration >= 0)) throw new RangeError('Step must be positive and duration not negative');
  const every = Math.max(1, Math.round((options.sampleEverySeconds ?? step) / step));
  let t1 = m.initialCoolantC ?? m.ambientC;
  let t2 = m.initialCabinC ?? m.ambientC;
  let t = 0;
  const out: TemperatureSample[] = [{ tSeconds: 0, coolantC: t1, cabinC: t2 }];
  const fullSteps = Math.floor(duration / step + 1e-9);
  const advance = (h: number): void => {
    const [k1a, k1b] = derivatives(m, t1, t2);
    const [k2a, k2b] = derivatives(m, t1 + (h / 2) * k1a, t2 + (h / 2) * k1b);
    const [k3a, k3b] = derivatives(m, t1 + (h / 2) * k2a, t2 + (h / 2) * k2b);
    const [k4a, k4b] = derivatives(m, t1 + h * k3a, t2 + h * k3b);
    t1 += (h / 6) * (k1a + 2 * k2a + 2 * k3a + k4a);
    t2 += (h / 6) * (k1b + 2 * k2b + 2 * k3b + k4b);
    t += h;
  };
  for (let i = 1; i <= fullSteps; i++) {
    advance(step);
    t = i * step; // avoid drift from repeated addition
    if (i % every === 0) out.push({ tSeconds: t, coolantC: t1, cabinC: t2 });
  }
  const rest = duration - fullSteps * step;
  if (rest > 1e-9 * step) {
    advance(rest);
    t = duration;
  }
  if (out[out.length - 1]!.tSeconds !== t) out.push({ tSeconds: t, coolantC: t1, cabinC: t2 });
  return out;
}

export interface EnergyBalance {
  /** Heat the heater put into node 1, J. */
  deliveredJ: number;
  /** Rise in stored heat of both nodes, J. */
  storedJ: number;
  /** Heat lost to the outside from both nodes, integrated over the samples (trapezoid rule), J. */
  lostJ: number;
  /** delivered − stored − lost, J. */
  residualJ: number;
  /** |residual| ÷ delivered. */
  relativeError: number;
}

/**
 * First-law check over a sampled warm-up: heat delivered = heat stored in both nodes + heat
 * lost to the outside. The losses are integrated from the samples, so this tests any
 * trajectory (closed form or numerical) against conservation of energy.
 */
export function energyBalance(m: TwoNodeModel, samples: ReadonlyArray<TemperatureSample>): EnergyBalance {
  checkModel(m);
  const first = samples[0];
  const last = samples[samples.length - 1];
  if (!first || !last || samples.length < 2) throw new RangeError('At least two samples are needed');
  const lossW = (s: TemperatureSample): number =>
    m.ua1aWPerK * (s.coolantC - m.ambientC) + m.ua2aWPerK * (s.cabinC - m.ambientC);
  let lostJ = 0;
  for (let i = 1; i < samples.length; i++) {
    const a = samples[i - 1]!;
    const b = samples[i]!;
    lostJ += ((lossW(a) + lossW(b)) / 2) * (b.tSeconds - a.tSeconds);
  }
  const deliveredJ = m.heatInputW * (last.tSeconds - first.tSeconds);
  const storedJ = m.c1JPerK * (last.coolantC - first.coolantC) + m.c2JPerK * (last.cabinC - first.cabinC);
  const residualJ = deliveredJ - storedJ - lostJ;
  return { deliveredJ, storedJ, lostJ, residualJ, relativeError: deliveredJ > 0 ? Math.abs(residualJ) / deliveredJ : Math.abs(residualJ) };
}

/**
 * Time (s) at which the coolant first reaches `targetC`, or null if the steady state stays at or
 * below it. Meant for a warm-up that starts at the outside temperature (as the planner's does):
 * then both temperatures rise monotonically
 * (A is a Metzler matrix, so e^(At) ≥ 0 and θ'(t) = e^(At)·b ≥ 0), so bisection is safe.
 */
export function timeToCoolantTemperature(solution: ClosedFormSolution, targetC: number): number | null {
  if (solution.at(0).coolantC >= targetC) return 0;
  if (!(solution.steadyState.coolantC > targetC)) return null;
  let lo = 0;
  let hi = Math.max(1, solution.timeConstantsSeconds[1]);
  while (solution.at(hi).coolantC < targetC) {
    lo = hi;
    hi *= 2;
    if (!Number.isFinite(hi)) return null;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-6; i++) {
    const mid = (lo + hi) / 2;
    if (solution.at(mid).coolantC < targetC) lo = mid;
    else hi = mid;
  }
  return hi;
}
