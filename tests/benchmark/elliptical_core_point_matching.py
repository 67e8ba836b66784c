#!/usr/bin/env python3
"""Independent full-vector point-matching computation of elliptical-core form birefringence.

What it computes
    The effective indices n_x, n_y of the x- and y-polarised fundamental (HE11-like) modes of a
    homogeneous elliptical core (index n1, semi-axis a along x, b along y) in an unbounded
    cladding n2, and the form birefringence B = n_x - n_y, for
      case 1: n1 1.4600 / n2 1.4454, lambda 1.55 um, semi-axes rho (1 +- 0.05), rho at V = 2.0
              (rho = 2.39553 um, the guide_at_v() radius of tests/solver/test_elliptical_birefringence.cpp);
      case 2: cases/elliptical_core.toml: n1 1.4700 / n2 1.4440, lambda 1.55 um, a = 2 um, b = 1 um.
    The script is a diagnostic written here from Maxwell's equations; it shares no code with the
    C++ finite-element solver and uses only the Python standard library and mpmath.

Formulation (derived here; formulas recalled from memory are marked so)
    * Fields ~ exp(i(beta z - omega t)), beta = k0 n_eff, h = Z0 H_z. Core: kappa^2 = u^2 =
      k0^2 n1^2 - beta^2; cladding: kappa^2 = -w^2 = k0^2 n2^2 - beta^2. From the curl equations
          E_t    = (i/kappa^2) (beta grad E_z - k0 z x grad h),
          Z0 H_t = (i/kappa^2) (beta grad h  + k0 n^2 z x grad E_z).
      With t the anticlockwise tangent of the boundary and n = t x z the outward normal,
      (z x grad f) . t = d_n f, so the tangential components are
          E_t . t = (i/kappa^2)(beta d_t E_z - k0 d_n h),  Z0 H_t . t = (i/kappa^2)(beta d_t h + k0 n^2 d_n E_z).
      For a guided mode E_z and h can both be taken real; all four conditions are then real.
    * Symmetry classes (derived from the mirrors x -> -x, y -> -y; E is a polar vector, H an
      axial one, so a mirror maps E -> M E(Mr), H -> -M H(Mr)). For the x-polarised mode (E_x even
      in x and y): E_z is odd in x, even in y; h is even in x, odd in y. Hence about the centre
          E_z = sum_{n odd} A_n J_n(u r) cos n phi,  h = sum_{n odd} B_n J_n(u r) sin n phi,
      (K_n(w r) outside). The y-polarised mode swaps cos and sin. On the circle the n = 1 term alone
      is the exact HE11 (checked in (a)).
    * Matching: E_z, h, E_t.t, Z0 H_t.t continuous at points of the ellipse boundary; by symmetry only
      the open first quadrant is sampled, at equal steps of the polar angle phi_k = (k - 1/2) pi/(2P)
      (equal steps of the parametric angle converge much worse at b/a = 0.5). Each point gives 4 real
      rows. Columns are scaled by J_n(u a) (interior) and K_n(w d) (exterior, d = the closest boundary
      distance from the expansion centre), analytic and non-zero near the root, so they do not move it.
      Collocation: P points for 4P unknowns, mode = zero of det(beta), found by secant.
    * Rayleigh limit (known limitation of cylindrical expansions): the exterior field continued
      into the core is singular on the focal segment |x| <= f = sqrt(a^2 - b^2) (the singularities of
      the ellipse's Schwarz function; from memory). A K_n series about the centre converges only
      for r > f. For case 1 f = 0.75 rho < b, no problem. For case 2 f = 1.73 um > b = 1 um, so the
      one-centre series can only converge weakly (completeness, not pointwise convergence) and it
      does so slowly (table below). The remedy used here: the exterior field is expanded about
      several centres on the major axis, (0, 0) and symmetric pairs (+-c, 0), each pair combined into
      the symmetry class (E_z: f(x - c, y) -+ f(-x - c, y); all orders n >= 0 about an offset
      centre). Each centre then only has to represent the part of the focal segment near it.
    * Least-squares cross-check: with more points than unknowns/4 (P_ls = 2 x), the mode is the
      minimum over beta of the smallest singular value of the column-normalised matrix; sigma_min^2 is
      obtained from the normal equations (Cholesky + inverse iteration at mp.dps 40) and minimised
      by repeated parabolic fits.
    * Perturbation reference: the first-order formula of docs/metrics.md / the header of
      tests/solver/test_elliptical_birefringence.cpp (derived in the project, not published),
      re-implemented here with mpmath Bessel functions:
          B = (2 Delta)^{3/2} eps g(V) / (2 k0 rho), g = U^2 W^2 S / (p^2 V^3), p = U J1/J0 = W K1/K0,
          alpha = V^2 / [U J1/J2 + W K1/K2], S = p^2 + 2p + W^2 - alpha (p + W K1/K2),
      Delta = (n1^2 - n2^2)/(2 n1^2), U, W of the round-core LP01 mode.
    * Sources: Maxwell's equations and Bessel recurrences (DLMF 10.6.1, 10.29.1, from memory);
      the point-matching idea for non-circular dielectric guides: J. E. Goell, Bell Syst. Tech. J.
      48, 2133 (1969) (from memory, not read). No published table of elliptical-core B was used.

Validation
    (a) a = b = 4.1 um, n 1.4504 / 1.4447, lambda 1.55 um: must give the exact HE11 1.4473080424
        (cladwise's exact step-index module) to ~1e-10, for x and y polarisation and any N.
    (b) Small ellipticity: B / B_formula must tend to 1 as Delta -> 0 (eps = 0.01), and at eps = 0.05
        it is compared with the FEM / formula ratios of docs/metrics.md.

How to run
    python3 tests/benchmark/elliptical_core_point_matching.py          (about 6 minutes, one core)
    python3 tests/benchmark/elliptical_core_point_matching.py --quick  (smaller N, about 3 minutes)

Measured output (mpmath 1.3.0, mp.dps = 30): see the comment block at the end of this file.
"""

import sys
import time

import mpmath as mp

mp.mp.dps = 30
LAMBDA_UM = mp.mpf("1.55")
K0 = 2 * mp.pi / LAMBDA_UM

# ---------------------------------------------------------------------------------------------
# Bessel tables (orders 0..nmax+1 at one argument)
# ---------------------------------------------------------------------------------------------


def bessel_j_table(nmax, z):
    """J_0..J_{nmax+1}(z): the top two orders from mpmath, then the (stable) downward recurrence
    J_{n-1} = (2n/z) J_n - J_{n+1} (DLMF 10.6.1, from memory)."""
    J = [None] * (nmax + 2)
    J[nmax + 1] = mp.besselj(nmax + 1, z)
    J[nmax] = mp.besselj(nmax, z)
    for n in range(nmax, 0, -1):
        J[n - 1] = 2 * n / z * J[n] - J[n + 1]
    return J


def bessel_k_table(nmax, z):
    """K_0..K_{nmax+1}(z) by the (stable) upward recurrence K_{n+1} = K_{n-1} + (2n/z) K_n
    (DLMF 10.29.1, from memory)."""
    K = [mp.besselk(0, z), mp.besselk(1, z)]
    for n in range(1, nmax + 1):
        K.append(K[n - 1] + 2 * n / z * K[n])
    return K


# ---------------------------------------------------------------------------------------------
# Boundary-matching matrix
# ---------------------------------------------------------------------------------------------


def boundary_points(a, b, P):
    """Parametric angles t of P points of the open first quadrant at equal polar-angle steps."""
    out = []
    for k in range(P):
        phi = (k + mp.mpf(1) / 2) * mp.pi / (2 * P)
        out.append(mp.atan2(a * mp.sin(phi), b * mp.cos(phi)))
    return out


def min_distance(a, b, c):
    """Distance from (c, 0), 0 <= c < a, to the ellipse x^2/a^2 + y^2/b^2 = 1."""
    f2 = a * a - b * b
    if c == 0 or f2 == 0:
        return min(a, b) if c == 0 else b
    return b * mp.sqrt(1 - c * c / f2) if c <= f2 / a else a - c


def basis_list(N_in, centres, pol, u, w, a, b):
    """(side, field, centre, order, scale) of each unknown. side 0 core (J about the origin, odd
    orders 1..2N_in-1), side 1 cladding (K about centre 0: odd orders 1..2M-1; about a pair +-c:
    M orders, 0..M-1 for the cos-type field, 1..M for the sin-type one)."""
    basis = []
    j_scale = bessel_j_table(2 * N_in, u * a)
    for fld in "eh":
        for j in range(N_in):
            basis.append((0, fld, 0, 2 * j + 1, j_scale[2 * j + 1]))
    for c, M in centres:
        k_scale = bessel_k_table(2 * M + 1, w * min_distance(a, b, c))
        for fld in "eh":
            if c == 0:
                orders = [2 * j + 1 for j in range(M)]
            else:
                cos_type = (fld == "e") == (pol == "x")
                orders = list(range(0, M)) if cos_type else list(range(1, M + 1))
            for n in orders:
                basis.append((1, fld, c, n, k_scale[n]))
    return basis


def matching_matrix(n_eff, n1, n2, a, b, N_in, centres, pol, P=None):
    """Rows: E_z, h, E_t.t, Z0 H_t.t (core minus cladding) at P boundary points; P = unknowns/4
    (square collocation) unless given."""
    beta = K0 * n_eff
    u = mp.sqrt((K0 * n1) ** 2 - beta ** 2)
    w = mp.sqrt(beta ** 2 - (K0 * n2) ** 2)
    rbar = mp.sqrt(a * b)
    basis = basis_list(N_in, centres, pol, u, w, a, b)
    nu = len(basis)
    if P is None:
        assert nu % 4 == 0, nu
        P = nu // 4
    nmax = max(bb[3] for bb in basis) + 1
    A = mp.matrix(4 * P, nu)
    for k, t in enumerate(boundary_points(a, b, P)):
        x, y = a * mp.cos(t), b * mp.sin(t)
        tx, ty = -a * mp.sin(t), b * mp.cos(t)
        norm = mp.sqrt(tx * tx + ty * ty)
        tx, ty = tx / norm, ty / norm
        nx, ny = ty, -tx
        cache = {}

        def polar_data(X, Y, side):
            key = (side, X, Y)
            if key not in cache:
                R = mp.sqrt(X * X + Y * Y)
                if side == 0:
                    T = bessel_j_table(nmax, u * R)
                    D = [-u * T[1]] + [u * (T[m - 1] - T[m + 1]) / 2 for m in range(1, nmax + 1)]
                else:
                    T = bessel_k_table(nmax, w * R)
                    D = [-w * T[1]] + [-w * (T[m - 1] + T[m + 1]) / 2 for m in range(1, nmax + 1)]
                cache[key] = (R, X / R, Y / R, mp.atan2(Y, X), T, D)
            return cache[key]

        for col, (side, fld, c, n, scale) in enumerate(basis):
            # x pol: E_z cos-type & odd in x, h sin-type & even in x; y pol: the reverse
            cos_type = (fld == "e") == (pol == "x")

            def term(X, Y):
                R, cP, sP, Phi, T, D = polar_data(X, Y, side)
                if cos_type:
                    g, dg = mp.cos(n * Phi), -n * mp.sin(n * Phi)
                else:
                    g, dg = mp.sin(n * Phi), n * mp.cos(n * Phi)
                gR, gP = D[n] * g, T[n] * dg / R
                return T[n] * g, gR * cP - gP * sP, gR * sP + gP * cP

            if c == 0:
                v, gx, gy = term(x, y)
            else:
                v1, gx1, gy1 = term(x - c, y)
                v2, gx2, gy2 = term(-x - c, y)
                s = -1 if cos_type else 1        # cos-type fields are the x-odd ones
                v, gx, gy = v1 + s * v2, gx1 - s * gx2, gy1 + s * gy2
            d_t = gx * tx + gy * ty
            d_n = gx * nx + gy * ny
            if side == 0:
                kappa2, n_r, sgn = u ** 2, n1, 1
            else:
                kappa2, n_r, sgn = -w ** 2, n2, -1
            fac = sgn * u ** 2 / kappa2 * rbar / K0 / scale   # common factor i and u^2 rbar/k0 dropped
            if fld == "e":
                A[4 * k + 0, col] = sgn * v / scale
                A[4 * k + 2, col] = fac * beta * d_t
                A[4 * k + 3, col] = fac * K0 * n_r ** 2 * d_n
            else:
                A[4 * k + 1, col] = sgn * v / scale
                A[4 * k + 2, col] = -fac * K0 * d_n
                A[4 * k + 3, col] = fac * beta * d_t
    return A


def secant(f, x0, x1, maxit=40):
    tol = mp.mpf(10) ** (-(mp.mp.dps // 2 + 3))
    f0, f1 = f(x0), f(x1)
    for it in range(maxit):
        if f1 == f0:
            return x1, it
        x2 = x1 - f1 * (x1 - x0) / (f1 - f0)
        x0, f0 = x1, f1
        x1, f1 = x2, f(x2)
        if abs(x1 - x0) < tol:
            return x1, it + 1
    raise RuntimeError("secant did not converge; last step %s" % mp.nstr(abs(x1 - x0), 5))


def collocation_root(n1, n2, a, b, N_in, centres, pol, guess):
    f = lambda ne: mp.det(matching_matrix(ne, n1, n2, a, b, N_in, centres, pol))
    return secant(f, guess, guess + mp.mpf("1e-9"))


def single_centre(N):
    """N odd harmonics inside and outside about the origin: 4N unknowns, N points."""
    return N, [(0, N)]


# ---------------------------------------------------------------------------------------------
# Least-squares variant: minimum over beta of sigma_min of the column-normalised matrix
# ---------------------------------------------------------------------------------------------


def sigma_min2(A):
    G = A.T * A
    d = [1 / mp.sqrt(G[i, i]) for i in range(G.rows)]          # unit-norm columns
    for i in range(G.rows):
        for j in range(G.cols):
            G[i, j] *= d[i] * d[j]
    L = mp.cholesky(G)
    x = mp.matrix([mp.mpf(1) / (k + 1) for k in range(G.rows)])
    lam = None
    for _ in range(8):
        y = _chol_solve(L, x)
        lam_new = 1 / mp.norm(y)
        x = y * lam_new
        if lam is not None and abs(lam_new - lam) < mp.mpf("1e-12") * lam_new:
            break
        lam = lam_new
    return lam_new


def _chol_solve(L, x):
    """Solve L L^T y = x by forward and back substitution."""
    n = L.rows
    z = [None] * n
    for i in range(n):
        z[i] = (x[i] - mp.fsum(L[i, j] * z[j] for j in range(i))) / L[i, i]
    y = [None] * n
    for i in reversed(range(n)):
        y[i] = (z[i] - mp.fsum(L[j, i] * y[j] for j in range(i + 1, n))) / L[i, i]
    return mp.matrix(y)


def least_squares_root(n1, n2, a, b, N_in, centres, pol, guess, oversample=2, h=mp.mpf("2e-6")):
    nu = len(basis_list(N_in, centres, pol, mp.mpf(1), mp.mpf(1), a, b))
    P = oversample * ((nu + 3) // 4)
    f = lambda ne: sigma_min2(matching_matrix(ne, n1, n2, a, b, N_in, centres, pol, P))
    x = guess
    for _ in range(25):
        fm, f0, fp = f(x - h), f(x), f(x + h)
        curv = fp - 2 * f0 + fm
        step = -h * (fp - fm) / (2 * curv) if curv > 0 else (h if fp < fm else -h)
        x = x + max(min(step, 2 * h), -2 * h)
        if abs(step) < h / 4:
            h = h / 20
        if h < mp.mpf("1e-14"):
            break
    return x, mp.sqrt(f(x))


# ---------------------------------------------------------------------------------------------
# Perturbation formula (docs/metrics.md) and round-core references
# ---------------------------------------------------------------------------------------------


def lp01_uw(v):
    w_of = lambda U: mp.sqrt(v * v - U * U)
    f = lambda U: U * mp.besselj(1, U) / mp.besselj(0, U) - w_of(U) * mp.besselk(1, w_of(U)) / mp.besselk(0, w_of(U))
    U = mp.findroot(f, v * mp.mpf("0.7"))
    return U, w_of(U)


def perturbation_b(n1, n2, rho, eps):
    v = K0 * rho * mp.sqrt(n1 ** 2 - n2 ** 2)
    U, W = lp01_uw(v)
    p = U * mp.besselj(1, U) / mp.besselj(0, U)
    wk12 = W * mp.besselk(1, W) / mp.besselk(2, W)
    alpha = v * v / (U * mp.besselj(1, U) / mp.besselj(2, U) + wk12)
    S = p * p + 2 * p + W * W - alpha * (p + wk12)
    g = U * U * W * W * S / (p * p * v ** 3)
    delta = (n1 ** 2 - n2 ** 2) / (2 * n1 ** 2)
    return (2 * delta) ** mp.mpf(1.5) * eps * g / (2 * K0 * rho)


def rho_at_v(n1, n2, v):
    return v / (K0 * mp.sqrt(n1 ** 2 - n2 ** 2))


def round_core_he11(n1, n2, rho):
    """HE11 of the round core (the n = 1 block alone is exact on the circle), as a starting guess:
    a coarse scan from just above n2 for the sign change of the 4x4 determinant, then secant."""
    f = lambda ne: mp.det(matching_matrix(ne, n1, n2, rho, rho, *single_centre(1), "x"))
    grid = [n2 + (n1 - n2) * mp.mpf(k) / 40 for k in range(1, 40)]
    vals = [f(ne) for ne in grid]
    k = max(i for i in range(len(grid) - 1) if vals[i] * vals[i + 1] < 0)
    return secant(f, grid[k], grid[k + 1])[0]


def pair(n1, n2, a, b, N_in, centres, guess_x, guess_y):
    nx, ix = collocation_root(n1, n2, a, b, N_in, centres, "x", guess_x)
    ny, iy = collocation_root(n1, n2, a, b, N_in, centres, "y", guess_y)
    return nx, ny, ix + iy


def main():
    quick = "--quick" in sys.argv
    t_start = time.time()

    print("(a) circle a = b = 4.1 um, n 1.4504 / 1.4447, lambda 1.55 um (exact HE11 1.4473080424)")
    n1, n2, R = mp.mpf("1.4504"), mp.mpf("1.4447"), mp.mpf("4.1")
    for N in (1, 4):
        nx, ny, _ = pair(n1, n2, R, R, *single_centre(N), mp.mpf("1.4473"), mp.mpf("1.4473"))
        print("    N = %d: n_x = %s, n_y - n_x = %s, n_x - exact = %s"
              % (N, mp.nstr(nx, 16), mp.nstr(ny - nx, 3), mp.nstr(nx - mp.mpf("1.4473080424"), 3)))
        assert abs(nx - mp.mpf("1.4473080424")) < 1e-10 and abs(ny - nx) < 1e-20

    print("(b) small ellipticity against the perturbation formula, V = 2, single centre N = 8")
    print("        Delta      eps    B point-matching    B formula     ratio   (FEM/formula, metrics.md)")
    fem_ratio = {("1.4600", "0.05"): "1.0169", ("1.4504", "0.05"): "1.0046", ("1.4475", "0.05"): "0.9986"}
    for c1, c2 in (("1.4600", "1.4454"), ("1.4504", "1.4447"), ("1.4475", "1.4447")):
        n1, n2 = mp.mpf(c1), mp.mpf(c2)
        rho = rho_at_v(n1, n2, 2)
        for e in ("0.01", "0.05"):
            eps = mp.mpf(e)
            g = round_core_he11(n1, n2, rho)
            nx, ny, _ = pair(n1, n2, rho * (1 + eps), rho * (1 - eps), *single_centre(8), g, g)
            bf = perturbation_b(n1, n2, rho, eps)
            delta = (n1 ** 2 - n2 ** 2) / (2 * n1 ** 2)
            print("    %.5f %%  %s   %.6e      %.6e   %.5f   %s"
                  % (100 * delta, e, nx - ny, bf, (nx - ny) / bf, fem_ratio.get((c1, e), "")))

    print("case 1: n 1.4600 / 1.4454, semi-axes rho(1 +- 0.05), rho = %s um (V = 2)"
          % mp.nstr(rho_at_v(mp.mpf("1.46"), mp.mpf("1.4454"), 2), 7))
    n1, n2 = mp.mpf("1.4600"), mp.mpf("1.4454")
    rho = rho_at_v(n1, n2, 2)
    a1, b1 = rho * mp.mpf("1.05"), rho * mp.mpf("0.95")
    print("     N  unknowns        n_x                   n_y                 B          time s")
    gx = gy = mp.mpf("1.45143")
    res1 = {}
    for N in (2, 4, 6, 8, 10, 12):
        t0 = time.time()
        nx, ny, _ = pair(n1, n2, a1, b1, *single_centre(N), gx, gy)
        gx, gy = nx, ny
        res1[N] = (nx, ny)
        print("    %2d   %3d   %s   %s   %s   %5.1f" % (N, 4 * N, mp.nstr(nx, 17), mp.nstr(ny, 17),
                                                      mp.nstr(nx - ny, 10), time.time() - t0))
    nx, ny = res1[12]
    b_fem = mp.mpf("7.05012e-6")
    print("    B = %s; FEM 7.05012e-06: (FEM - PM)/PM = %+.3f %%; formula %s"
          % (mp.nstr(nx - ny, 9), float(100 * (b_fem - (nx - ny)) / (nx - ny)),
             mp.nstr(perturbation_b(n1, n2, rho, mp.mpf("0.05")), 6)))
    mp.mp.dps = 40
    nx40, ny40, _ = pair(n1, n2, a1, b1, *single_centre(10), nx, ny)
    mp.mp.dps = 30
    print("    N = 10 at dps 40 minus dps 30: n_x %s, n_y %s"
          % (mp.nstr(nx40 - res1[10][0], 3), mp.nstr(ny40 - res1[10][1], 3)))

    print("case 2: n 1.4700 / 1.4440, a = 2 um, b = 1 um (cases/elliptical_core.toml)")
    n1, n2, a2, b2 = mp.mpf("1.47"), mp.mpf("1.444"), mp.mpf(2), mp.mpf(1)
    # FEM values of the case's earlier mesh (0.2 um core elements, 12k unknowns); with the case's
    # present 0.12 um mesh (27k) the FEM gives B 1.37176e-4, 56k gives 1.37222e-4 (docs/metrics.md).
    fem_x, fem_y = mp.mpf("1.450191256244"), mp.mpf("1.450054191667")
    print("  single centre (Rayleigh series; f = 1.73 um > b): slow")
    print("     N  unknowns        n_x               n_y              B        n_x - FEM   time s")
    gx, gy = mp.mpf("1.45019"), mp.mpf("1.45005")
    for N in ((4, 8, 12, 16) if quick else (4, 8, 12, 16, 20, 24)):
        t0 = time.time()
        nx, ny, _ = pair(n1, n2, a2, b2, *single_centre(N), gx, gy)
        gx, gy = nx, ny
        print("    %2d   %3d   %s   %s   %s   %s   %5.1f" % (N, 4 * N, mp.nstr(nx, 13), mp.nstr(ny, 13),
              mp.nstr(nx - ny, 7), mp.nstr(nx - fem_x, 3), time.time() - t0))

    f = mp.sqrt(a2 ** 2 - b2 ** 2)
    print("  three expansion centres for the cladding field, 0 and +-0.4 f, +-0.8 f (f = %s um);"
          % mp.nstr(f, 6))
    print("  least squares, 2x oversampled, mp.dps 40; sigma = smallest singular value at the minimum")
    print("    N_in  M0  M1  unknowns  rows       n_x           sigma_x          n_y           sigma_y"
          "          B        time s")
    # (16, 8, 10) is left out: at dps 40 its basis is numerically redundant (sigma_min ~ 1e-16 over
    # a wide beta range) and the minimiser wandered to a wrong n_x (see the reading at the end).
    configs = [(8, 4, 6)] + ([] if quick else [(12, 6, 8)])
    res2 = {}
    mp.mp.dps = 40
    for N_in, M0, M1 in configs:
        centres = [(0, M0), (f * mp.mpf("0.4"), M1), (f * mp.mpf("0.8"), M1)]
        nu = 2 * N_in + 2 * M0 + 4 * M1
        t0 = time.time()
        nx, sx = least_squares_root(n1, n2, a2, b2, N_in, centres, "x", gx)
        ny, sy = least_squares_root(n1, n2, a2, b2, N_in, centres, "y", gy)
        gx, gy = nx, ny
        res2[N_in] = (nx, ny)
        print("    %3d  %3d %3d   %4d    %4d   %s  %s   %s  %s   %s   %5.1f"
              % (N_in, M0, M1, nu, 8 * ((nu + 3) // 4), mp.nstr(nx, 13), mp.nstr(sx, 3), mp.nstr(ny, 13),
                 mp.nstr(sy, 3), mp.nstr(nx - ny, 8), time.time() - t0))
    centres = [(0, 6), (f * mp.mpf("0.4"), 8), (f * mp.mpf("0.8"), 8)]
    t0 = time.time()
    r_col, _ = collocation_root(n1, n2, a2, b2, 12, centres, "x", gx)
    print("    square collocation, same basis (12, 6, 8): n_x = %s (%.0f s); the collocation roots of"
          " the three-centre basis scatter by ~1e-7 between bases, least squares by ~1e-9"
          % (mp.nstr(r_col, 13), time.time() - t0))
    mp.mp.dps = 50
    t0 = time.time()
    centres = [(0, 4), (f * mp.mpf("0.4"), 6), (f * mp.mpf("0.8"), 6)]
    r50, _ = least_squares_root(n1, n2, a2, b2, 8, centres, "x", res2[8][0])
    print("    (8, 4, 6) n_x at dps 50 minus dps 40: %s (%.0f s)" % (mp.nstr(r50 - res2[8][0], 3), time.time() - t0))
    mp.mp.dps = 30
    nx, ny = res2[configs[-1][0]]
    print("    FEM: n_x %s, n_y %s, B 1.37065e-4. PM - FEM: n_x %s, n_y %s; (FEM - PM)/PM B = %+.3f %%"
          % (mp.nstr(fem_x, 13), mp.nstr(fem_y, 13), mp.nstr(nx - fem_x, 3), mp.nstr(ny - fem_y, 3),
             float(100 * ((fem_x - fem_y) - (nx - ny)) / (nx - ny))))
    print("total time %.0f s" % (time.time() - t_start))


if __name__ == "__main__":
    main()

# Measured output (mpmath 1.3.0, Python 3.11, one core of a shared 2-core machine). This run still
# included a third least-squares row (16, 8, 10), shown and explained below; its final "FEM" line was
# printed for that (wrong) row and is replaced here by the line for the (12, 6, 8) row, computed by
# hand from the printed numbers (which is what the current script prints as its last comparison).
#
#   (a) circle a = b = 4.1 um, n 1.4504 / 1.4447, lambda 1.55 um (exact HE11 1.4473080424)
#       N = 1: n_x = 1.447308042373348, n_y - n_x = 0.0, n_x - exact = -2.67e-11
#       N = 4: n_x = 1.447308042373348, n_y - n_x = 0.0, n_x - exact = -2.67e-11
#   (b) small ellipticity against the perturbation formula, V = 2, single centre N = 8
#           Delta      eps    B point-matching    B formula     ratio   (FEM/formula, metrics.md)
#       0.99500 %  0.01   1.411387e-06      1.386640e-06   1.01785
#       0.99500 %  0.05   7.056669e-06      6.933201e-06   1.01781   1.0169
#       0.39222 %  0.01   2.155422e-07      2.140515e-07   1.00696
#       0.39222 %  0.05   1.077678e-06      1.070258e-06   1.00693   1.0046
#       0.19325 %  0.01   5.203606e-08      5.185872e-08   1.00342
#       0.19325 %  0.05   2.601727e-07      2.592936e-07   1.00339   0.9986
#   case 1: n 1.4600 / 1.4454, semi-axes rho(1 +- 0.05), rho = 2.395535 um (V = 2)
#        N  unknowns        n_x                   n_y                 B          time s
#        2     8   1.4514347164557988   1.4514276620352172   7.054420582e-6     0.2
#        4    16   1.4514349036612055   1.4514278469920696   7.056669136e-6     0.5
#        6    24   1.4514349037629457   1.4514278470941246   7.056668821e-6     0.9
#        8    32   1.4514349037630152   1.4514278470941946   7.056668821e-6     1.2
#       10    40   1.4514349037630153   1.4514278470941946   7.056668821e-6     2.0
#       12    48   1.4514349037630153   1.4514278470941946   7.056668821e-6     3.3
#       B = 7.05666882e-6; FEM 7.05012e-06: (FEM - PM)/PM = -0.093 %; formula 6.9332e-6
#       N = 10 at dps 40 minus dps 30: n_x 4.72e-28, n_y 4.77e-28
#   case 2: n 1.4700 / 1.4440, a = 2 um, b = 1 um (cases/elliptical_core.toml)
#     single centre (Rayleigh series; f = 1.73 um > b): slow
#        N  unknowns        n_x               n_y              B        n_x - FEM   time s
#        4    16   1.449999552349   1.449860614574   0.0001389378   -0.000192     0.5
#        8    32   1.450142748811   1.45000361424   0.0001391346   -4.85e-5     2.5
#       12    48   1.450173952129   1.45003544282   0.0001385093   -1.73e-5     6.5
#       16    64   1.450184060743   1.450045960536   0.0001381002   -7.2e-6    12.3
#       20    80   1.450188258097   1.450050414952   0.0001378431   -3.0e-6    24.8
#       24    96   1.450190090837   1.450052426112   0.0001376647   -1.17e-6    36.4
#     three expansion centres for the cladding field, 0 and +-0.4 f, +-0.8 f (f = 1.73205 um);
#     least squares, 2x oversampled, mp.dps 40; sigma = smallest singular value at the minimum
#       N_in  M0  M1  unknowns  rows       n_x           sigma_x          n_y           sigma_y          B        time s
#         8    4   6     48      96   1.450191426431  1.92e-9   1.450054128971  2.07e-9   0.00013729746    75.6
#        12    6   8     68     136   1.450191427556  3.93e-13   1.450054129436  4.06e-13   0.00013729812   112.3
#        16    8  10     88     176   1.450092501556  7.93e-17   1.450054129439  8.12e-17   3.8372117e-5   331.8
#       square collocation, same basis (12, 6, 8): n_x = 1.450191456766 (10 s); the collocation roots of the three-centre basis scatter by ~1e-7 between bases, least squares by ~1e-9
#       (8, 4, 6) n_x at dps 50 minus dps 40: 3.43e-21 (23 s)
#       FEM: n_x 1.450191256244, n_y 1.450054191667, B 1.37065e-4. PM - FEM: n_x 1.71e-7, n_y -6.22e-8; (FEM - PM)/PM B = -0.170 %
#   total time 663 s (with the (16, 8, 10) row; about 330 s without it)
#
# Reading.
# * (a) The circle reproduces the exact HE11 to 2.7e-11 (the reference is quoted to 10 decimals);
#   x and y are exactly degenerate.
# * (b) B(point matching)/B(formula) = 1 + 1.78 Delta (1.0178, 1.0069, 1.0034 at Delta = 0.995,
#   0.392, 0.193 %), the same at eps = 0.01 and 0.05: the formula's leading order is confirmed, and
#   its O(Delta) correction is +1.78 Delta. The FEM ratios of docs/metrics.md (1.0169, 1.0046, 0.9986)
#   fall below these by 0.09, 0.23, 0.48 %, i.e. FEM B is low by 6.5e-9, 2.6e-9, 1.3e-9 (the same
#   order as the FEM pair-splitting noise bound 2e-9 of the round-core test). The FEM ratio 0.9986 at
#   Delta 0.19 % is therefore an FEM error, not a sign that the formula is approached from above.
# * Case 1: converged to 16 digits by N = 8 (f = 0.75 rho < b: the single-centre series converges):
#   n_x = 1.451434903763015, n_y = 1.451427847094195, B = 7.05666882e-6. FEM 7.05012e-6 is 0.093 %
#   (6.5e-9) low.
# * Case 2, single centre: converges slowly (n_x error falls ~0.4x per 4 harmonics) towards the
#   three-centre value; not usable on its own. Three centres, least squares: (8, 4, 6) and (12, 6, 8)
#   agree to 1.1e-9 (n_x) and 4.7e-10 (n_y); dps 50 changes nothing. Best values:
#   n_x = 1.4501914276, n_y = 1.4500541294 (both +-~2e-9), B = 1.372981e-4 (+-~1e-9 absolute).
#   FEM (the case's earlier mesh, 12k unknowns): n_x 1.7e-7 low, n_y 6.2e-8 high, B = 1.37065e-4 is 0.17 % low.
#   The (16, 8, 10) row is a failure of this method, not a result: the column-normalised basis is
#   numerically rank-deficient at dps 40 (sigma_min ~ 1e-16 for every beta), so sigma_min(beta) has no
#   sharp minimum; its n_y happens to agree (1.450054129439) but its n_x wandered 1e-4 off. Square
#   collocation on the three-centre basis gives roots scattered by ~1e-7 and is not used for the value.
