"""Independent reference for M_Rd(N) of an RC annulus with an optional removed sector.

Shares no code with stackwake. EN 1992-1-1 parabola-rectangle (3.17, 3.18), bilinear steel
with horizontal top branch (3.2.7), eps_cu2 at the extreme compressed fibre. Concrete
integrated in polar coordinates with scipy.integrate.quad (nested), bars as a smeared ring
integrated with quad in the angle; neutral axis by scipy.optimize.brentq.
Run: python3 tests/reference/rc_annulus_mrd.py
"""
import math
from scipy.integrate import quad
from scipy.optimize import brentq


def concrete_stress(eps, fcd, ec2=2e-3, n=2.0):
    if eps <= 0:
        return 0.0
    if eps < ec2:
        return fcd * (1 - (1 - eps / ec2) ** n)
    return fcd


def forces(ro, ri, rings, fcd, fyd, es, x, ecu2=3.5e-3, ec2=2e-3, sector=None):
    """sector = (half_angle, azimuth) in the frame where bending compresses azimuth 0."""
    ytop = ro
    if sector is not None:
        b, a = sector
        lo, hi = a - b, a + b
        if lo <= 0 <= hi:
            ytop = ro * max(math.cos(lo), math.cos(hi))
    # ultimate plane, no pivot C (x < h assumed in these checks)
    kap = ecu2 / x
    yn = ytop - x

    def inside(t):
        if sector is None:
            return True
        b, a = sector
        d = (t - a + math.pi) % (2 * math.pi) - math.pi
        return abs(d) > b

    def conc_n(t):
        if not inside(t):
            return 0.0
        c = math.cos(t)
        f = lambda r: concrete_stress(kap * (r * c - yn), fcd, ec2) * r
        pts = []
        if abs(c) > 1e-12:
            for yv in (yn, yn + ec2 / kap):
                rr = yv / c
                if ri < rr < ro:
                    pts.append(rr)
        return quad(f, ri, ro, points=pts or None, limit=200, epsabs=0, epsrel=1e-12)[0]

    def conc_m(t):
        if not inside(t):
            return 0.0
        c = math.cos(t)
        f = lambda r: concrete_stress(kap * (r * c - yn), fcd, ec2) * r * r * c
        pts = []
        if abs(c) > 1e-12:
            for yv in (yn, yn + ec2 / kap):
                rr = yv / c
                if ri < rr < ro:
                    pts.append(rr)
        return quad(f, ri, ro, points=pts or None, limit=200, epsabs=0, epsrel=1e-12)[0]

    brk = [0.0, math.pi]
    if sector is not None:
        b, a = sector
        brk += [(a - b) % (2 * math.pi), (a + b) % (2 * math.pi)]
    n = m = 0.0
    grid = sorted(set(brk + [2 * math.pi]))
    grid = [g for g in grid if 0 <= g <= 2 * math.pi]
    # finer angular pieces help quad with the kinks of the strain limits
    fine = []
    for g0, g1 in zip(grid[:-1], grid[1:]):
        k = 64
        fine += [g0 + (g1 - g0) * i / k for i in range(k)]
    fine.append(2 * math.pi)
    for g0, g1 in zip(fine[:-1], fine[1:]):
        n += quad(conc_n, g0, g1, epsabs=0, epsrel=1e-11, limit=200)[0]
        m += quad(conc_m, g0, g1, epsabs=0, epsrel=1e-11, limit=200)[0]
    for r, area in rings:
        per = area / (2 * math.pi)
        sig = lambda t: max(-fyd, min(fyd, es * kap * (r * math.cos(t) - yn))) if inside(t) else 0.0
        for g0, g1 in zip(fine[:-1], fine[1:]):
            n += quad(lambda t: sig(t) * per, g0, g1, epsabs=0, epsrel=1e-12)[0]
            m += quad(lambda t: sig(t) * per * r * math.cos(t), g0, g1, epsabs=0, epsrel=1e-12)[0]
    return n, m


def mrd(ro, ri, rings, fcd, fyd, es, N, sector=None):
    h = 2 * ro
    x = brentq(lambda x: forces(ro, ri, rings, fcd, fyd, es, x, sector=sector)[0] - N,
               1e-4 * h, 0.999 * h, xtol=1e-12)
    return forces(ro, ri, rings, fcd, fyd, es, x, sector=sector)[1], x


if __name__ == "__main__":
    # Solid disc D = 500 mm, C30 alpha_cc 0.85, B500, ring r = 0.2 m, As = 41.55 cm2.
    print("disc", mrd(0.25, 0.0, [(0.2, 41.55e-4)], 0.85 * 30e6 / 1.5, 500e6 / 1.15, 200e9, 1570e3))
    # Annulus D = 10 m, t = 0.4 m, rho 0.003/0.002, covers 0.05, C40, B500, N = 60 MN,
    # with and without a sector of half-angle 0.35 rad on the compressed side / tension side.
    ro, ri = 5.0, 4.6
    ac = math.pi * (ro ** 2 - ri ** 2)
    rings = [(ro - 0.05, 0.003 * ac), (ri + 0.05, 0.002 * ac)]
    fcd, fyd = 40e6 / 1.5, 500e6 / 1.15
    print("annulus", mrd(ro, ri, rings, fcd, fyd, 200e9, 60e6))
    print("annulus sector compressed", mrd(ro, ri, rings, fcd, fyd, 200e9, 60e6, sector=(0.35, 0.0)))
    print("annulus sector tension", mrd(ro, ri, rings, fcd, fyd, 200e9, 60e6, sector=(0.35, math.pi)))
