"""Reference values for dispersion-residual.test.ts (run: python3 dispersion-residual.py; Python 3 fractions, exact).

For each spacecraft of packages/sdk/examples/review/kestrel-block-a.review.json (IERS 2010 constants, reference TT,
a0 = 26 790 000 m, sigma_a = 1500 m, phase tolerance 1e-6 s), with c the double the review reads as its configured
fractional offset, the residual rate of the configured oscillator in orbit at a = a0 + k*sigma (k = -3..3) is
    (1 + c)(1 + r(a)) - 1,   r(a) = L_G - 3GM/(2ac^2)
(IERS Conventions 2010 eq. 10.9 averaged over a Kepler orbit [V1]), evaluated here in exact rational arithmetic
from the doubles GM = 3.986004418e14 m^3/s^2, L_G = 6.969290134e-10 and the exact c = 299 792 458 m/s, then rounded
once to the nearest double. Also printed: the product form (1 + c)*(1 + r) - 1 evaluated in doubles, which the
review used before, and the days to the phase tolerance 1e-6 / |residual| / 86400 at the worst of k = -3, 0, 3.
"""
from fractions import Fraction as F

GM = F(3.986004418e14)
LG = F(6.969290134e-10)
C = F(299792458)
NOMINAL = 10230000.0
A0, SIGMA, TOL = 26790000, 1500, F(1e-6)

# The configured fractional offset as the review reads it (check.ts configuredFraction), in doubles:
#   fractionalOffset as written; offsetFrequencyHz as (f - f0)/f0; a tuning word as (word*clk - f0*2^N)/2^N/f0,
#   with the difference formed exactly.
CONFIGURED = {
    'KESTREL-01': -4.486072e-10,
    'KESTREL-02': (10229999.9954107 - NOMINAL) / NOMINAL,
    'KESTREL-03': float(28794890104583 * 100000000 - 10230000 * 2**48) / 2**48 / NOMINAL,
}


def rate(a):
    return LG - 3 * GM / (2 * a * C * C)


for sc, c in CONFIGURED.items():
    print(sc, 'configured c =', repr(c))
    residuals = {}
    for k in range(-3, 4):
        a = A0 + k * SIGMA
        exact = (1 + F(c)) * (1 + rate(a)) - 1
        residuals[k] = exact
        r_double = float(LG) - 1.5 * (float(GM) / (a * float(C * C)))
        product = (1 + c) * (1 + r_double) - 1
        print(f'  k = {k:+d}: exact {float(exact)!r}   product form in doubles {product!r}')
    worst = max(abs(residuals[k]) for k in (-3, 0, 3))
    print('  days to tolerance at the worst residual:', repr(float(TOL / worst / 86400)))
