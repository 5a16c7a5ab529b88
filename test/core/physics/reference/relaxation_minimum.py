"""Check values of test/core/physics/relaxation.test.ts: the exact least-squares
minimum of the two demo series (demo/measurements.md), found as the root of the
gradient of the residual sum of squares in 50-digit arithmetic with mpmath.
Run: python3 relaxation_minimum.py (mpmath 1.3)."""
from mpmath import mp, mpf, exp, cos, pi, findroot

mp.dps = 50

# Decay S_n = S0 exp(-t_n/T1) cos^(n-1)(5 deg), n = 1, 2, ...
t = [0, 6, 12, 18, 24, 30, 36, 42, 48, 54]
s = [mpf(v) for v in ['1.0', '0.8844', '0.769', '0.6822', '0.5956', '0.5267', '0.4598', '0.4079', '0.3561', '0.3143']]
theta = 5 * pi / 180


def decay_gradient(a, k):
    ga = gk = 0
    for i, (ti, si) in enumerate(zip(t, s)):
        e = exp(-ti / k) * cos(theta) ** i
        r = si - a * e
        ga += -2 * r * e
        gk += -2 * r * a * e * ti / k ** 2
    return [ga, gk]


print('decay S0, T1 [s]:', findroot(decay_gradient, (mpf(1), mpf(48))).T)

# Build-up S(t) = Sinf (1 - exp(-t/tau)) + S0, times in minutes converted to s.
tt = [60 * m for m in [0, 5, 10, 20, 30, 45, 60, 90]]
ss = [mpf(v) for v in ['0.02', '0.257', '0.431', '0.672', '0.805', '0.911', '0.953', '0.984']]


def buildup_gradient(a, k, b):
    g = [0, 0, 0]
    for ti, si in zip(tt, ss):
        e = exp(-ti / k)
        r = si - (a * (1 - e) + b)
        g[0] += -2 * r * (1 - e)
        g[1] += -2 * r * (-a * e * ti / k ** 2)
        g[2] += -2 * r
    return g


print('build-up Sinf, tau [s], S0:', findroot(buildup_gradient, (mpf('0.97'), mpf(1080), mpf('0.02'))).T)
