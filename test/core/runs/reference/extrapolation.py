"""Check values of test/core/runs/physics.test.ts, computed by hand in 40-digit decimals.

Exponential decay law (F. Bloch, Phys. Rev. 70, 460 (1946)): P(t) = P(t0) exp(-(t - t0)/T1),
so P(to) = P(from) exp((from - to)/T1). Uncertainty by the law of propagation of uncertainty for
uncorrelated inputs, GUM (JCGM 100:2008) eq. (10): u^2 = sum (df/dx_i)^2 u(x_i)^2.
Run: python3 extrapolation.py (Python's standard library only).
"""
from decimal import Decimal as D, getcontext

getcontext().prec = 40


def case(p, up, t_from, t_to, t1, ut1):
    x = (t_from - t_to) / t1
    g = x.exp()
    value = p * g
    c_p = g  # dP_to/dP
    c_t1 = -value * (t_from - t_to) / (t1 * t1)  # dP_to/dT1
    u = ((c_p * up) ** 2 + (c_t1 * ut1) ** 2).sqrt()
    return value, u


for args in [
    (D("0.200"), D("0.004"), D(42), D(0), D("47.9"), D("1.2")),
    (D("0.150"), D("0.003"), D(40), D(10), D("30.0"), D("0.9")),
]:
    v, u = case(*args)
    print([str(a) for a in args], "->", f"{v:.15e}", f"{u:.15e}")
