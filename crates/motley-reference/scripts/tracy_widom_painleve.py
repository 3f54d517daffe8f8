"""Independent check values for motley-reference's Tracy-Widom tables.

Method (independent of the Rust code: no Fredholm determinant, no Gauss-Legendre, mpmath's own
Airy function and ODE solver): the Hastings-McLeod solution of Painleve II,
    q'' = s q + 2 q^3,   q(s) ~ Ai(s) as s -> +inf,
integrated backwards from s0 = 16 (where q = Ai up to a relative O(Ai^2) ~ 1e-38) with mpmath's
Taylor-series ODE solver at 50 digits, together with
    I0(s) = int_s^inf q,  I1(s) = int_s^inf q^2,  I2(s) = int_s^inf (x - s) q(x)^2 dx.
Then (Tracy and Widom 1994, 1996)
    F2(s) = exp(-I2(s)),  F2'(s) = F2(s) I1(s),  F1(s) = sqrt(F2(s)) exp(-I0(s)/2).
Run: python3 tracy_widom_painleve.py   (mpmath 1.3.0 was used for the values in the tests)
"""
import mpmath as mp

mp.mp.dps = 50
s0 = mp.mpf(16)
q0 = mp.airyai(s0)
dq0 = mp.airyai(s0, 1)
i0 = mp.quad(mp.airyai, [s0, mp.inf])
i1 = mp.quad(lambda x: mp.airyai(x) ** 2, [s0, mp.inf])
i2 = mp.quad(lambda x: (x - s0) * mp.airyai(x) ** 2, [s0, mp.inf])


# Integrate in t = s0 - s >= 0 (mpmath's odefun integrates forwards).
def rhs(t, y):
    s = s0 - t
    q, dq, a0, a1, a2 = y
    # d/dt = -d/ds
    return [-dq, -(s * q + 2 * q ** 3), q, q ** 2, a1]


sol = mp.odefun(rhs, 0, [q0, dq0, i0, i1, i2])
print("mpmath", mp.__version__)
for s in [6, 4, 3, 2, 1, 0, -1, -2, -3, -4, -5, -6]:
    q, dq, a0, a1, a2 = sol(s0 - s)
    f2 = mp.exp(-a2)
    print(
        f"s={s:3d}  F2={mp.nstr(f2, 20)}  1-F2={mp.nstr(-mp.expm1(-a2), 20)}  "
        f"f2={mp.nstr(f2 * a1, 20)}  F1={mp.nstr(mp.sqrt(f2) * mp.exp(-a0 / 2), 20)}  "
        f"1-F1={mp.nstr(-mp.expm1(-a2 / 2 - a0 / 2), 20)}"
    )
