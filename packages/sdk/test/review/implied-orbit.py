"""Reference values for implied-orbit.test.ts (run: python3 implied-orbit.py; mpmath 1.3, 50 digits).

For a configured factory offset c (the double that JSON "-4.53e-10" parses to), the rate it compensates is
r = 1/(1 + c) - 1 evaluated exactly, and the circular orbit that needs it is a = 3GM/(2c^2(L_G - r))
(IERS Conventions 2010 eq. 10.9 averaged over a Kepler orbit [V1]; IERS 2010 GM and L_G).
Also printed: what the cancellation-prone double form 1/(1 + c) - 1 gives.
"""
from mpmath import mp, mpf

mp.dps = 50
GM = mpf('3.986004418e14')
LG = mpf('6.969290134e-10')
C = mpf(299792458)
for text in ['-4.53e-10', '-5.3e-10', '-1e-15']:
    c = mpf(float(text))
    r = 1 / (1 + c) - 1
    a = 3 * GM / (2 * C**2 * (LG - r))
    naive = 1 / (1 + float(text)) - 1
    print(text, 'r =', mp.nstr(r, 20), 'a =', mp.nstr(a, 20), 'm; double 1/(1+c)-1 =', repr(naive))
