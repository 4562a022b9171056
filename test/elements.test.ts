import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { ArgumentError } from '../src/errors';
import { barConsistentMassPlane, barConsistentMassSpace, barLumpedMassSpace, barStiffnessPlane, barStiffnessSpace } from '../src/elements/bar';
import { beamConsistentMass, beamLumpedMass, beamStiffness } from '../src/elements/beam';
import { planeFrameConsistentMass, planeFrameLumpedMass, planeFrameStiffness } from '../src/elements/planeFrame';
import { pointMassDiagonal } from '../src/elements/pointMass';
import { memberAxes, spaceFrameConsistentMass, spaceFrameLumpedMass, spaceFrameStiffness } from '../src/elements/spaceFrame';
import { groundedSpringStiffness, twoNodeSpringStiffness } from '../src/elements/spring';
import { timoshenkoConsistentMass, timoshenkoLumpedMass, timoshenkoShearParameter, timoshenkoStiffness } from '../src/elements/timoshenko';
import { transform } from '../src/elements/transform';
import type { PlaneFrameProps, SpaceFrameProps } from '../src/elements/types';

const mul = (a: Float64Array, x: number[]): number[] => {
  const n = x.length;
  return Array.from({ length: n }, (_, i) => x.reduce((s, xj, j) => s + a[i * n + j] * xj, 0));
};
const quad = (a: Float64Array, x: number[]): number => mul(a, x).reduce((s, v, i) => s + v * x[i], 0);
const maxAbs = (a: ArrayLike<number>): number => Array.from(a).reduce((m, v) => Math.max(m, Math.abs(v)), 0);
const symmetric = (a: Float64Array, n: number): number => {
  let e = 0;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) e = Math.max(e, Math.abs(a[i * n + j] - a[j * n + i]));
  return e / maxAbs(a);
};
const eig = (a: Float64Array, n: number): number[] => {
  const rows = Array.from({ length: n }, (_, i) => Array.from(a.subarray(i * n, i * n + n)));
  return new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues.slice().sort((p, q) => p - q);
};

// Gauss-Legendre 5-point rule on [0, 1] (exact to degree 9; Abramowitz & Stegun, Table 25.4).
const GX = [0, -0.5384693101056831, 0.5384693101056831, -0.906179845938664, 0.906179845938664];
const GW = [0.5688888888888889, 0.47862867049936647, 0.47862867049936647, 0.23692688505618908, 0.23692688505618908];
function integrate(f: (xi: number) => number): number {
  return GX.reduce((s, x, k) => s + 0.5 * GW[k] * f(0.5 * (x + 1)), 0);
}

describe('Euler-Bernoulli beam element', () => {
  const E = 2.1e11, I = 8e-6, A = 5e-3, rho = 7850, L = 1.7;
  it('stiffness has the two rigid-body modes as its null space and is symmetric', () => {
    // Rigid translation (1, 0, 1, 0) and rigid rotation (0, 1, L, 1) store no strain energy
    // (beam kinematics).
    const k = beamStiffness(E, I, L);
    expect(symmetric(k, 4)).toBe(0);
    expect(maxAbs(mul(k, [1, 0, 1, 0]))).toBeLessThan(1e-9 * maxAbs(k));
    expect(maxAbs(mul(k, [0, 1, L, 1]))).toBeLessThan(1e-9 * maxAbs(k));
    // Tip stiffness of a cantilever 3EI/L³ (statics): condense the clamped end out.
    const k33 = k[10], k34 = k[11], k44 = k[15];
    expect(k33 - (k34 * k34) / k44).toBeCloseTo((3 * E * I) / L ** 3, 3);
  });
  it('consistent and lumped mass carry the member mass ρAL in a rigid translation', () => {
    // Kinetic energy of a rigid translation: uᵀMu = ρAL (mechanics).
    expect(quad(beamConsistentMass(rho, A, L), [1, 0, 1, 0])).toBeCloseTo(rho * A * L, 9);
    expect(quad(beamLumpedMass(rho, A, L), [1, 0, 1, 0])).toBeCloseTo(rho * A * L, 9);
    // Rigid rotation about the mid-point: ρA L³/12 (moment of inertia of a slender rod).
    expect(quad(beamConsistentMass(rho, A, L), [-L / 2, 1, L / 2, 1])).toBeCloseTo((rho * A * L ** 3) / 12, 8);
    const ml = beamLumpedMass(rho, A, L);
    expect([ml[5], ml[15]]).toEqual([0, 0]); // lumped: zero rotary mass (documented convention)
  });
  it('rejects a non-positive length with ArgumentError naming L', () => {
    try {
      beamStiffness(E, I, 0);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ArgumentError);
      expect((e as ArgumentError).path).toBe('L');
    }
  });
});

describe('Timoshenko beam element', () => {
  const E = 2.1e11, G = 8.1e10, A = 0.02, I = 6.67e-5, rho = 7850, kappa = 5 / 6, L = 0.9;
  const phi = timoshenkoShearParameter(E, I, G, A, kappa, L);
  // Interdependent interpolation of Friedman & Kosmatka (1993), eqs. for N_v and N_θ (from
  // memory; they interpolate the static Timoshenko solution exactly, as checked at the ends).
  const mu = 1 / (1 + phi);
  const Nv = (x: number) => [mu * (2 * x ** 3 - 3 * x ** 2 - phi * x + 1 + phi), mu * L * (x ** 3 - (2 + phi / 2) * x ** 2 + (1 + phi / 2) * x), -mu * (2 * x ** 3 - 3 * x ** 2 - phi * x), mu * L * (x ** 3 - (1 - phi / 2) * x ** 2 - (phi / 2) * x)];
  const dNv = (x: number) => [mu * (6 * x ** 2 - 6 * x - phi) / L, mu * (3 * x ** 2 - 2 * (2 + phi / 2) * x + 1 + phi / 2), -mu * (6 * x ** 2 - 6 * x - phi) / L, mu * (3 * x ** 2 - 2 * (1 - phi / 2) * x - phi / 2)];
  const Nt = (x: number) => [(6 * mu / L) * (x * x - x), mu * (3 * x * x - (4 + phi) * x + 1 + phi), -(6 * mu / L) * (x * x - x), mu * (3 * x * x - (2 - phi) * x)];
  const dNt = (x: number) => [(6 * mu / L) * (2 * x - 1) / L, mu * (6 * x - (4 + phi)) / L, -(6 * mu / L) * (2 * x - 1) / L, mu * (6 * x - (2 - phi)) / L];

  it('the shape functions take unit values at their own DOF', () => {
    expect(Nv(0)[0]).toBeCloseTo(1, 14);
    expect(Nv(1)[2]).toBeCloseTo(1, 14);
    expect(Nt(0)[1]).toBeCloseTo(1, 14);
    expect(Nt(1)[3]).toBeCloseTo(1, 14);
  });
  it('stiffness equals EI∫θ′θ′ + κGA∫γγ of the Friedman-Kosmatka shape functions', () => {
    const k = timoshenkoStiffness(E, I, L, phi);
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        const ref = L * integrate((x) => E * I * dNt(x)[i] * dNt(x)[j] + kappa * G * A * (dNv(x)[i] - Nt(x)[i]) * (dNv(x)[j] - Nt(x)[j]));
        expect(Math.abs(k[i * 4 + j] - ref)).toBeLessThan(1e-9 * maxAbs(k));
      }
    }
  });
  it('consistent mass equals ρA∫NvNv + ρI∫NθNθ of the same shape functions (Przemieniecki 1968, ch. 11)', () => {
    const m = timoshenkoConsistentMass(rho, A, I, L, phi);
    for (let i = 0; i < 4; i++) {
      for (let j = 0; j < 4; j++) {
        const ref = L * integrate((x) => rho * A * Nv(x)[i] * Nv(x)[j] + rho * I * Nt(x)[i] * Nt(x)[j]);
        expect(Math.abs(m[i * 4 + j] - ref)).toBeLessThan(1e-12 * maxAbs(m));
      }
    }
  });
  it('reduces to the Euler-Bernoulli matrices (plus rotary inertia) when Φ = 0', () => {
    const kt = timoshenkoStiffness(E, I, L, 0);
    const kb = beamStiffness(E, I, L);
    kt.forEach((v, i) => expect(v).toBeCloseTo(kb[i], 3));
    // With I = 0 the rotary part vanishes: the mass equals Przemieniecki's ρAL/420 matrix.
    const mt = timoshenkoConsistentMass(rho, A, 0, L, 0);
    const mb = beamConsistentMass(rho, A, L);
    mt.forEach((v, i) => expect(v).toBeCloseTo(mb[i], 9));
  });
  it('lumped mass: ρAL/2 on translations and ρIL/2 rotary inertia on rotations', () => {
    const m = timoshenkoLumpedMass(rho, A, I, L);
    expect([m[0], m[5], m[10], m[15]]).toEqual([(rho * A * L) / 2, (rho * I * L) / 2, (rho * A * L) / 2, (rho * I * L) / 2]);
  });
});

describe('bar element', () => {
  it('plane stiffness: EA/L along the member, nothing across it', () => {
    // Axial stiffness EA/L (Hooke's law); a 30° member.
    const E = 2e11, A = 1e-3, L = 2;
    const c = Math.cos(Math.PI / 6), s = Math.sin(Math.PI / 6);
    const k = barStiffnessPlane(E, A, L * c, L * s);
    expect(quad(k, [0, 0, c, s])).toBeCloseTo((E * A) / L, 0);
    expect(Math.abs(quad(k, [0, 0, -s, c]))).toBeLessThan(1e-6);
    expect(eig(k, 4).filter((l) => Math.abs(l) < 1e-6 * (E * A) / L)).toHaveLength(3);
  });
  it('space stiffness has rank 1; masses carry ρAL in every direction', () => {
    const k = barStiffnessSpace(1e9, 1e-4, 1, 2, 2);
    expect(eig(k, 6).filter((l) => Math.abs(l) > 1e-9 * maxAbs(k))).toHaveLength(1);
    const m = 7850 * 1e-4 * 3; // ρAL, L = 3
    for (const u of [[1, 0, 0, 1, 0, 0], [0, 1, 0, 0, 1, 0], [0, 0, 1, 0, 0, 1]]) {
      expect(quad(barConsistentMassSpace(7850, 1e-4, 1, 2, 2), u)).toBeCloseTo(m, 10);
      expect(quad(barLumpedMassSpace(7850, 1e-4, 1, 2, 2), u)).toBeCloseTo(m, 10);
    }
    expect(quad(barConsistentMassPlane(7850, 1e-4, 3, 0), [1, 0, 1, 0])).toBeCloseTo(m, 10);
  });
});

describe('transform', () => {
  it('equals Tᵀ k T computed with ml-matrix', () => {
    const n = 6;
    const k = Float64Array.from({ length: 36 }, (_, i) => Math.sin(i * 1.3) + Math.cos((i % 6) * (Math.floor(i / 6) + 1)));
    const th = 0.7;
    const r = [Math.cos(th), Math.sin(th), 0, -Math.sin(th), Math.cos(th), 0, 0, 0, 1];
    const T = Matrix.zeros(n, n);
    for (let b = 0; b < 2; b++) for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) T.set(3 * b + i, 3 * b + j, r[3 * i + j]);
    const K = new Matrix(Array.from({ length: n }, (_, i) => Array.from(k.subarray(i * n, i * n + n))));
    const ref = T.transpose().mmul(K).mmul(T);
    const out = transform(k, r, 3, 2);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(out[i * n + j]).toBeCloseTo(ref.get(i, j), 12);
  });
});

describe('plane frame element', () => {
  const p: PlaneFrameProps = { E: 2.1e11, A: 4e-3, I: 2e-5, density: 7850, theory: 'euler-bernoulli' };
  it('global stiffness has exactly the three rigid-body modes of the plane and rotation-invariant eigenvalues', () => {
    const k0 = planeFrameStiffness(p, 3, 0);
    const k1 = planeFrameStiffness(p, 3 * Math.cos(1.1), 3 * Math.sin(1.1));
    const e0 = eig(k0, 6);
    const e1 = eig(k1, 6);
    expect(e0.filter((l) => Math.abs(l) < 1e-9 * e0[5])).toHaveLength(3);
    e0.forEach((l, i) => expect(Math.abs(l - e1[i])).toBeLessThan(1e-9 * e0[5]));
    // Rigid rotation about node 1 of a member along (c, s): u = θ·(−y, x) at each node.
    const c = Math.cos(1.1), s = Math.sin(1.1);
    expect(maxAbs(mul(k1, [0, 0, 1, -3 * s, 3 * c, 1]))).toBeLessThan(1e-8 * e0[5]);
  });
  it('consistent and lumped masses carry ρAL in both directions', () => {
    const m = 7850 * 4e-3 * 3;
    for (const M of [planeFrameConsistentMass(p, 3 * Math.cos(0.4), 3 * Math.sin(0.4)), planeFrameLumpedMass(p, 3)]) {
      expect(quad(M, [1, 0, 0, 1, 0, 0])).toBeCloseTo(m, 9);
      expect(quad(M, [0, 1, 0, 0, 1, 0])).toBeCloseTo(m, 9);
    }
  });
  it('Timoshenko theory without G or kappa throws ArgumentError', () => {
    expect(() => planeFrameStiffness({ ...p, theory: 'timoshenko' }, 1, 0)).toThrow(ArgumentError);
  });
});

describe('space frame element and its local axes', () => {
  const p: SpaceFrameProps = { E: 2.1e11, G: 8.1e10, A: 4e-3, Iy: 2e-5, Iz: 5e-6, J: 1e-6, density: 7850, theory: 'euler-bernoulli' };
  it('default rule: a member along +X has y = +Y, z = +Z', () => {
    expect(Array.from(memberAxes(2, 0, 0)).map((v) => v + 0)).toEqual([1, 0, 0, 0, 1, 0, 0, 0, 1]);
  });
  it('default rule: local y is horizontal and z points up for an inclined member', () => {
    const r = memberAxes(1, 2, 3);
    expect(Math.abs(r[5])).toBeLessThan(1e-15); // y has no Z component
    expect(r[8]).toBeGreaterThan(0);
  });
  it('default rule: a vertical member has y = +Y and z = x × y', () => {
    expect(Array.from(memberAxes(0, 0, 4)).map((v) => v + 0)).toEqual([0, 0, 1, 0, 1, 0, -1, 0, 0]);
    expect(Array.from(memberAxes(0, 0, -4)).map((v) => v + 0)).toEqual([0, 0, -1, 0, 1, 0, 1, 0, 0]);
  });
  it('orientation vector lies in the local x–y plane; a parallel one throws', () => {
    const r = memberAxes(3, 0, 0, [1, 0, 5]);
    expect(Array.from(r).map((v) => v + 0)).toEqual([1, 0, 0, 0, 0, 1, 0, -1, 0]);
    expect(() => memberAxes(3, 0, 0, [2, 0, 0])).toThrow(ArgumentError);
  });
  it('stiffness has exactly six rigid-body modes; masses carry ρAL in each direction', () => {
    for (const theory of ['euler-bernoulli', 'timoshenko'] as const) {
      const q = { ...p, theory, kappa: 0.85 };
      const k = spaceFrameStiffness(q, 1.2, -0.7, 2.1);
      expect(symmetric(k, 12)).toBeLessThan(1e-14);
      const e = eig(k, 12);
      expect(e.filter((l) => Math.abs(l) < 1e-9 * e[11])).toHaveLength(6);
      const L = Math.hypot(1.2, -0.7, 2.1);
      for (const M of [spaceFrameConsistentMass(q, 1.2, -0.7, 2.1), spaceFrameLumpedMass(q, 1.2, -0.7, 2.1)]) {
        expect(symmetric(M, 12)).toBeLessThan(1e-14);
        for (let d = 0; d < 3; d++) {
          const u = new Array(12).fill(0);
          u[d] = 1;
          u[6 + d] = 1;
          expect(quad(M, u)).toBeCloseTo(7850 * 4e-3 * L, 9);
        }
      }
    }
  });
  it('torsional inertia of the consistent mass uses Ip = Iy + Iz: ρ·Ip·L/3 on the diagonal', () => {
    const m = spaceFrameConsistentMass(p, 2, 0, 0);
    expect(m[3 * 12 + 3]).toBeCloseTo((7850 * (2e-5 + 5e-6) * 2) / 3, 12);
    expect(spaceFrameConsistentMass({ ...p, Ip: 1e-5 }, 2, 0, 0)[3 * 12 + 3]).toBeCloseTo((7850 * 1e-5 * 2) / 3, 12);
  });
});

describe('point mass and springs', () => {
  it('point mass diagonal in plane and space', () => {
    expect(Array.from(pointMassDiagonal(5, 2, 'plane'))).toEqual([5, 5, 2]);
    expect(Array.from(pointMassDiagonal(5, 0, 'space'))).toEqual([5, 5, 5, 0, 0, 0]);
    expect(() => pointMassDiagonal(-1, 0, 'space')).toThrow(ArgumentError);
  });
  it('springs', () => {
    expect(Array.from(groundedSpringStiffness(3))).toEqual([3]);
    expect(Array.from(twoNodeSpringStiffness(3))).toEqual([3, -3, -3, 3]);
    expect(() => twoNodeSpringStiffness(0)).toThrow(ArgumentError);
  });
});
