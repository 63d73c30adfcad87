"""Reference values for j2-secular.test.ts (run: python3 j2-secular-rates.py; mpmath 1.3, 40 digits).

Secular J2 rates of a mean orbit (D. A. Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. (2013),
§9.6 [M]; Kozai 1959 first-order theory [M]), with p = a(1 - e^2) and n = sqrt(GM/a^3):
  dRAAN/dt = -(3/2) n J2 (R/p)^2 cos i
  domega/dt = (3/4) n J2 (R/p)^2 (4 - 5 sin^2 i)
  dM/dt    = n + (3/4) n J2 (R/p)^2 sqrt(1 - e^2) (2 - 3 sin^2 i)
for an invented MEO mean orbit a = 26 560 000 m, e = 0.01, i = 0.96 rad, with the GM and R of two constant sets
(IS-GPS-200 mu = 3.986005e14 m^3/s^2 with the WGS 84 R = 6 378 137 m; IERS 2010 GM = 3.986004418e14 m^3/s^2,
R = 6 378 136.6 m) and J2 = 1.0826359e-3 (IERS 2010 Table 1.1) in both.
"""
from mpmath import mp, mpf, cos, sin, sqrt, nstr, pi

mp.dps = 40
A, E, I, J2 = mpf(26_560_000), mpf('0.01'), mpf('0.96'), mpf('1.0826359e-3')
for name, gm, r in [('gps-icd', '3.986005e14', '6378137.0'), ('iers-2010', '3.986004418e14', '6378136.6')]:
    gm, r = mpf(gm), mpf(r)
    n = sqrt(gm / A**3)
    k = n * J2 * (r / (A * (1 - E**2))) ** 2
    raan = -mpf(3) / 2 * k * cos(I)
    argp = mpf(3) / 4 * k * (4 - 5 * sin(I) ** 2)
    mdot = n + mpf(3) / 4 * k * sqrt(1 - E**2) * (2 - 3 * sin(I) ** 2)
    print(name, 'raan', nstr(raan, 17), 'argp', nstr(argp, 17), 'M', nstr(mdot, 17),
          '| raan', nstr(raan * 86400 * 180 / pi, 10), 'deg/day')
