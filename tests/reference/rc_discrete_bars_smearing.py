"""Smearing error of a ring of n discrete bars, for the circular column of
tests/resistance_smolcic_grandic_circular_section.rs.

stackwake smears each bar layer into a thin ring (BarRing: radius, area). A real section has
n discrete bars; this script measures what the smearing changes in M_Rd(N) of the published
example's column (D = 500 mm, C30/37, B500, bar centres 50 mm from the face, N_Ed = 1570 kN),
with the 21 bars of 16 mm that the xc verification script chooses for the required 41.55 cm2.

Shares no code with stackwake. Concrete: EN 1992-1-1 parabola-rectangle (3.17, 3.18) through
`forces` of tests/reference/rc_annulus_mrd.py (scipy quad in polar coordinates; no rings
passed, so it integrates concrete only); each bar a point with the bilinear steel of 3.2.7
(horizontal top branch); eps_cu2 = 3.5e-3 at the extreme compressed fibre; neutral axis by
scipy.optimize.brentq. The bars' orientation relative to the bending direction matters for
discrete bars: theta0 = 0 puts a bar on the compressed diameter, theta0 = pi / n puts the
bending axis half-way between two bars; the minimum over a sweep of orientations is reported.
Also: the steel area the smeared model needs to reach M_Ed = 392 kN m, to compare with the
article's 41.55 cm2 as a required area.

Run: python3 tests/reference/rc_discrete_bars_smearing.py   (numpy 2.4, scipy 1.17)
"""
import math
import os
import sys

from scipy.optimize import brentq

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from rc_annulus_mrd import forces  # noqa: E402  (concrete-only integration, no bars)

RO = 0.25
R_BARS = 0.20
FYD = 500e6 / 1.15
ES = 200e9
ECU2 = 3.5e-3
N_ED = 1570e3


def bar_forces(n_bars, area_bar, theta0, x):
    kap = ECU2 / x
    yn = RO - x
    n = m = 0.0
    for i in range(n_bars):
        t = theta0 + 2 * math.pi * i / n_bars
        y = R_BARS * math.cos(t)
        s = max(-FYD, min(FYD, ES * kap * (y - yn)))
        n += s * area_bar
        m += s * area_bar * y
    return n, m


def ring_forces(area, x):
    # Thin ring, integrated exactly enough by a fine midpoint sum (the stress is piecewise
    # smooth in the angle; 20000 points give < 1e-7 relative here).
    k = 20000
    return bar_forces(k, area / k, math.pi / k, x)


def mrd(fcd, steel, x_lo=1e-3, x_hi=0.999 * 2 * RO):
    def total(x):
        nc, mc = forces(RO, 0.0, [], fcd, FYD, ES, x)
        ns, ms = steel(x)
        return nc + ns, mc + ms

    x = brentq(lambda x: total(x)[0] - N_ED, x_lo, x_hi, xtol=1e-10)
    return total(x)[1], x


if __name__ == "__main__":
    a16 = math.pi * 0.008 ** 2
    n_bars = 21
    for alpha_cc in (0.85, 1.0):
        fcd = alpha_cc * 30e6 / 1.5
        m_ring, _ = mrd(fcd, lambda x: ring_forces(41.55e-4, x))
        m_ring21, _ = mrd(fcd, lambda x: ring_forces(n_bars * a16, x))
        sweep = []
        for j in range(9):
            th = (math.pi / n_bars) * j / 8
            sweep.append((mrd(fcd, lambda x, th=th: bar_forces(n_bars, a16, th, x))[0], th))
        m_min, th_min = min(sweep)
        m_max, th_max = max(sweep)
        print(f"alpha_cc {alpha_cc}: smeared 41.55 cm2 {m_ring:.3f} N m; "
              f"smeared 21 x 16 mm ({n_bars * a16 * 1e4:.3f} cm2) {m_ring21:.3f} N m")
        print(f"  21 discrete bars: min {m_min:.3f} N m at theta0 {th_min:.5f}, "
              f"max {m_max:.3f} N m at theta0 {th_max:.5f}; "
              f"theta0 = 0: {sweep[0][0]:.3f}, theta0 = pi/n: {sweep[-1][0]:.3f}")
        print(f"  smearing error (discrete / smeared, same area): "
              f"{m_min / m_ring21 - 1:+.5f} .. {m_max / m_ring21 - 1:+.5f}")
        # Steel area (smeared) with M_Rd(1570 kN) = 392 kN m.
        a_req = brentq(lambda a: mrd(fcd, lambda x: ring_forces(a, x))[0] - 392e3,
                       20e-4, 80e-4, xtol=1e-9)
        print(f"  smeared area for 392 kN m: {a_req * 1e4:.4f} cm2 "
              f"({a_req / 41.55e-4 - 1:+.5f} against 41.55 cm2)")
