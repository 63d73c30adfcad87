"""Reference values for the meanRateSensitivity checks in rate.test.ts (run: python3 rate-sensitivity.py; exact).

d/da (L_G - 3GM/(2ac^2)) = 3GM/(2a^2c^2) per metre (derivative of IERS Conventions 2010 eq. 10.9 averaged over a
Kepler orbit [V1]), in exact rational arithmetic from the doubles GM (IERS 2010 3.986004418e14, GPS ICD
3.986005e14 m^3/s^2), the double a and the exact c = 299 792 458 m/s, rounded once to the nearest double.
"""
from fractions import Fraction as F

C = F(299792458)
for name, gm in [('iers-2010', 3.986004418e14), ('gps-icd', 3.986005e14)]:
    for a in [7_000_000, 26_561_750, 26_790_000, 42_164_200]:
        s = 3 * F(gm) / (2 * F(a) ** 2 * C * C)
        print(name, a, repr(float(s)))
