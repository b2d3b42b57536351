"""Reference natural frequencies of cantilever shells "as drawn", by an ODE shooting method.

Independent of stackwake: shares no code with its finite elements or its section module.
Run:  python3 shooting.py > frequencies.csv   (numpy + scipy; scipy 1.17 was used)

Model (the beam model stackwake documents, every case invented):
  Timoshenko beam, state (w, psi, M, Q):
    w'   = psi + Q / (k G A)          (k G A = inf for Euler-Bernoulli)
    psi' = M / (E I)
    M'   = -Q - rho I omega^2 psi     (rotary inertia rho I, 0 for Euler-Bernoulli)
    Q'   = -m omega^2 w               (m = rho A, kg/m)
  base z = 0: fixed (w = psi = 0) or springs with foundation inertia:
    Q(0) = (k_lat - omega^2 M_f) w(0),  M(0) = (k_rot - omega^2 J_f) psi(0)
  top z = H:  Q(H) = omega^2 M_t w(H),   M(H) = omega^2 J_t psi(H)   (tip mass, inertia)
  (natural boundary conditions of U - T with the foundation and tip terms).
Cowper's shear coefficient for a hollow circle, k = 6(1+nu)(1+m^2)^2 / ((7+6nu)(1+m^2)^2 +
(20+12nu) m^2), m = d/D (Cowper 1966, table 1). At an opening the net section is integrated
numerically (scipy.integrate.dblquad in polar coordinates over the wall that remains), the
beam uses its smaller principal second moment, and the shear area is k(full annulus) x net
area (the assumption stackwake states).
The frequency equation det(top conditions) = 0 is bracketed on a grid (500 points up to
15 Hz) and solved with brentq; solve_ivp (DOP853, rtol 1e-12) integrates piece by piece between property changes.
dblquad may warn of roundoff at epsrel 1e-13 for the opening; the FE agrees with these
numbers to 8e-11 relative, so the warning is about the last digits only. Runs in ~40 s.
"""

import math
import sys

import numpy as np
from scipy.integrate import dblquad, solve_ivp
from scipy.optimize import brentq


def cowper(d_out, wall, nu):
    m = (d_out - 2 * wall) / d_out
    a = (1 + m * m) ** 2
    return 6 * (1 + nu) * a / ((7 + 6 * nu) * a + (20 + 12 * nu) * m * m)


def net_section(d_out, wall, cuts):
    """Area and smaller principal second moment about the net centroid, by quadrature.
    cuts: list of (width, azimuth_rad); half-angle asin(width / D)."""
    r_out, r_in = d_out / 2, d_out / 2 - wall
    removed = []
    for width, az in cuts:
        beta = math.asin(width / d_out)
        removed.append((az - beta, az + beta))
    # remaining angular intervals on [a0, a0 + 2 pi), a0 = end of the first cut
    removed.sort()
    arcs = []
    for k, (s, e) in enumerate(removed):
        nxt = removed[(k + 1) % len(removed)][0] + (2 * math.pi if k + 1 == len(removed) else 0)
        arcs.append((e, nxt))

    def integral(f):
        return sum(
            dblquad(lambda r, t: f(r, t) * r, a, b, r_in, r_out, epsabs=0, epsrel=1e-13)[0]
            for a, b in arcs
        )

    area = integral(lambda r, t: 1.0)
    cx = integral(lambda r, t: r * math.cos(t)) / area
    cy = integral(lambda r, t: r * math.sin(t)) / area
    ixx = integral(lambda r, t: (r * math.sin(t) - cy) ** 2)
    iyy = integral(lambda r, t: (r * math.cos(t) - cx) ** 2)
    ixy = integral(lambda r, t: (r * math.cos(t) - cx) * (r * math.sin(t) - cy))
    i_min = 0.5 * (ixx + iyy) - math.sqrt(0.25 * (ixx - iyy) ** 2 + ixy ** 2)
    return area, i_min


class Piece:
    """Uniform properties over [z0, z1]."""

    def __init__(self, z0, z1, d_out, wall, e, rho, nu, timoshenko, cuts=()):
        self.z0, self.z1 = z0, z1
        d_in = d_out - 2 * wall
        a_gross = math.pi / 4 * (d_out ** 2 - d_in ** 2)
        i_gross = math.pi / 64 * (d_out ** 4 - d_in ** 4)
        if cuts:
            area, inertia = net_section(d_out, wall, cuts)
        else:
            area, inertia = a_gross, i_gross
        g = e / (2 * (1 + nu))
        self.ei = e * inertia
        self.m = rho * area
        self.kga = cowper(d_out, wall, nu) * g * area if timoshenko else math.inf
        self.rho_i = rho * inertia if timoshenko else 0.0


def shoot(pieces, omega2, y0, ei0):
    """State scaled as (w, psi, M / EI0, Q / EI0) so every component is of order one."""
    y = np.array(y0, dtype=float)
    for p in pieces:
        a = ei0 / p.kga if math.isfinite(p.kga) else 0.0
        b = ei0 / p.ei
        c = p.rho_i * omega2 / ei0
        d = p.m * omega2 / ei0

        def rhs(z, s, a=a, b=b, c=c, d=d):
            w, psi, mom, q = s
            return [psi + a * q, b * mom, -q - c * psi, -d * w]

        sol = solve_ivp(rhs, (p.z0, p.z1), y, method="DOP853", rtol=1e-12, atol=1e-14)
        y = sol.y[:, -1]
    return y


def characteristic(case, omega):
    o2 = omega * omega
    ei0 = case["pieces"][0].ei
    base = case.get("base")
    if base is None:
        starts = [[0, 0, 1, 0], [0, 0, 0, 1]]
    else:
        k_lat, k_rot, m_f, j_f = base
        starts = [[1, 0, 0, (k_lat - o2 * m_f) / ei0], [0, 1, (k_rot - o2 * j_f) / ei0, 0]]
    m_t, j_t = case.get("tip", (0.0, 0.0))
    rows = []
    for s in starts:
        w, psi, mom, q = shoot(case["pieces"], o2, s, ei0)
        rows.append((q - o2 * m_t * w / ei0, mom - o2 * j_t * psi / ei0))
    (a, b), (c, d) = rows
    return a * d - b * c


def frequencies(case, modes, f_max):
    grid = np.linspace(0.05, f_max, 500)
    vals = [characteristic(case, 2 * math.pi * f) for f in grid]
    roots = []
    for k in range(len(grid) - 1):
        if vals[k] * vals[k + 1] < 0:
            f = brentq(lambda f: characteristic(case, 2 * math.pi * f), grid[k], grid[k + 1],
                       xtol=1e-13, rtol=1e-13)
            roots.append(f)
            if len(roots) == modes:
                break
    return roots


def cases():
    E, RHO, NU = 32e9, 2500.0, 0.2
    out = []
    for beam in ("euler-bernoulli", "timoshenko"):
        tim = beam == "timoshenko"
        # wall step at 30 m: t = 0.40 below, 0.25 above; D = 8 m, H = 80 m
        out.append(("stepped_wall", beam, {"pieces": [
            Piece(0, 30, 8.0, 0.40, E, RHO, NU, tim),
            Piece(30, 80, 8.0, 0.25, E, RHO, NU, tim)]}))
        # two concrete zones: 0-30 m E 36 GPa rho 2550; 30-80 m E 28 GPa nu 0.15
        out.append(("two_zones", beam, {"pieces": [
            Piece(0, 30, 8.0, 0.30, 36e9, 2550.0, NU, tim),
            Piece(30, 80, 8.0, 0.30, 28e9, RHO, 0.15, tim)]}))
        # opening 5-15 m, width 2.5 m, in a D = 6 m, t = 0.3 m tube of 60 m
        out.append(("opening", beam, {"pieces": [
            Piece(0, 5, 6.0, 0.30, E, RHO, NU, tim),
            Piece(5, 15, 6.0, 0.30, E, RHO, NU, tim, cuts=[(2.5, 0.0)]),
            Piece(15, 60, 6.0, 0.30, E, RHO, NU, tim)]}))
        # foundation: k_rot 500 GN m/rad, k_lat 3000 MN/m, M_f 2e6 kg, J_f 5e8 kg m2
        out.append(("foundation_inertia", beam, {
            "pieces": [Piece(0, 80, 8.0, 0.30, E, RHO, NU, tim)],
            "base": (3000e6, 500e9, 2.0e6, 5.0e8)}))
        # tip mass 2e5 kg with rotary inertia 5e6 kg m2 at 80 m
        out.append(("tip_rotary_inertia", beam, {
            "pieces": [Piece(0, 80, 8.0, 0.30, E, RHO, NU, tim)],
            "tip": (2.0e5, 5.0e6)}))
    return out


def main():
    w = sys.stdout.write
    w("# Reference frequencies (Hz) by ODE shooting; generated by shooting.py (scipy)\n")
    w("case,beam,mode,frequency_hz\n")
    for name, beam, case in cases():
        for k, f in enumerate(frequencies(case, 3, 15.0)):
            w(f"{name},{beam},{k + 1},{f:.12e}\n")


if __name__ == "__main__":
    main()
