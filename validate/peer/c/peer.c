/*
 * peer.c — the comparison peer of ricochet's performance harness.
 *
 * A stand-alone scattering solver written the way a careful user would write
 * it around a general-purpose library: the GNU Scientific Library's adaptive
 * Runge–Kutta–Prince–Dormand 8(9) pair (gsl_odeiv2_step_rk8pd, Prince &
 * Dormand 1981) driven by gsl_odeiv2_evolve_apply with the standard
 * y-scaled control (gsl_odeiv2_control_y_new, eps_abs = eps_rel = tol),
 * around hand-coded right-hand sides. Units G = c = 1, probe mass m = 1.
 *
 *   P1  relativistic point charge in a repulsive Coulomb field, κ = qQ = 1
 *       (Gaussian units), v = 0.6, b = 10. Lorentz force in Cartesian
 *       coordinates, state (x⃗, p⃗), independent variable: coordinate time
 *       by default (dx⃗/dt = p⃗/√(m² + p²), dp⃗/dt = κ r⃗/r³), or proper time
 *       with --time proper (dx⃗/dτ = p⃗/m, dp⃗/dτ = (√(m²+p²)/m) κ r⃗/r³).
 *       The two cost the same number of evaluations to within a few per
 *       cent on this problem; coordinate time is the default.
 *
 *   P2  timelike geodesic of Schwarzschild (M = 1) in Cartesian Kerr–Schild
 *       coordinates, v = 0.5, b = 30:
 *           g_μν = η_μν + H l_μ l_ν,  H = 2M/r,  l_μ = (1, x/r, y/r, z/r),
 *       (Kerr & Schild 1965, from memory). State (x⃗, u⁰, u⃗), proper time;
 *       t is not integrated (the metric is static and the deflection does
 *       not need it). The Christoffel contraction is derived in closed form
 *       below (function rhs_p2).
 *
 * Careful set-up (both problems): the start is at radius R on a line
 * parallel to the incoming direction +x, with the exact conserved energy
 * and angular momentum of the asymptotic state (E = γm, L = p∞ b): the
 * momentum at the start points along +x, its magnitude follows from E at
 * r = R, and the line's offset y₀ = L/|p| makes the angular momentum exact.
 * The run stops at the first accepted step with r ≥ R moving outwards.
 *
 * Tails: at both ends the transverse first-order impulse of the straight
 * line through the end state is added in closed form (from −∞ to the start,
 * and from the stop to +∞): the asymptotic directions are
 *     d̂_in  ∝ p⃗_start − Δp⃗_⊥(−∞ → start),
 *     d̂_out ∝ p⃗_stop  + Δp⃗_⊥(stop → +∞),
 * and χ = angle(d̂_in, d̂_out) = atan2(|d̂_in × d̂_out|, d̂_in·d̂_out).
 * The remaining truncation error is of second order, O(ε² (b/R)²), plus
 * O(ε (b/R)³).
 *
 * Cost: every call of the right-hand side is counted; the wall time of one
 * trajectory (set-up, integration, tails) is measured with
 * clock_gettime(CLOCK_MONOTONIC), and the median over --repeats runs is
 * reported.
 *
 * Output: tab-separated, one header line, then one line per configuration:
 *     code problem tol R evals median_seconds chi chi_exact abs_err status
 * with R in units of b. chi_exact comes from the command line (--chi1,
 * --chi2); the harness computes it in Go from the exact solutions.
 *
 * Build: gcc -O2 -o peer peer.c -lgsl -lgslcblas -lm
 */

#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_odeiv2.h>

/* Problem parameters (probe mass 1, G = c = 1). */
static const double MASS = 1.0;
static const double P1_KAPPA = 1.0, P1_V = 0.6, P1_B = 10.0;
static const double P2_M = 1.0, P2_V = 0.5, P2_B = 30.0;

static long n_evals; /* right-hand-side evaluations of the current run */
static int proper_time; /* P1: integrate in proper time */

/* ---------- P1: Lorentz force of a fixed Coulomb charge ---------- */

static int rhs_p1(double t, const double y[], double f[], void *params)
{
	(void)t;
	(void)params;
	n_evals++;
	const double x = y[0], yy = y[1], z = y[2];
	const double px = y[3], py = y[4], pz = y[5];
	const double r2 = x * x + yy * yy + z * z;
	const double r = sqrt(r2);
	const double ek = sqrt(MASS * MASS + px * px + py * py + pz * pz);
	double c = P1_KAPPA / (r2 * r); /* κ/r³ */
	if (proper_time) {
		f[0] = px / MASS;
		f[1] = py / MASS;
		f[2] = pz / MASS;
		c *= ek / MASS;
	} else {
		f[0] = px / ek;
		f[1] = py / ek;
		f[2] = pz / ek;
	}
	f[3] = c * x;
	f[4] = c * yy;
	f[5] = c * z;
	return GSL_SUCCESS;
}

/*
 * ---------- P2: geodesic in Kerr–Schild Schwarzschild ----------
 *
 * With g = η + H l l, n̂ = x⃗/r, w = l_α u^α = u⁰ + n̂·u⃗ and the static
 * derivatives ∂_i H = −H n_i/r, ∂_i l_j = (δ_ij − n_i n_j)/r, the lowered
 * contraction A_μ = Γ_μαβ u^α u^β = ∂_α g_μβ u^α u^β − ½ ∂_μ g_αβ u^α u^β is
 *     A_μ = (H/r) [ S l_μ + ½ w² (0, n̂) ],  S = |u⃗|² − (n̂·u⃗)² − (n̂·u⃗) w,
 * and raising with g^μν = η^μν − H l^μ l^ν (l^μ = (−1, n̂) is null, so this
 * inverse is exact), using l^ν A_ν = (H/2r) w², gives
 *     d²t/dτ²   = (H/r) [ S − ½ H w² ],
 *     d²x⃗/dτ²  = −(H/r) n̂ [ S + ½ (1 − H) w² ].
 * The spatial acceleration is radial, as it must be (L = r² dφ/dτ is
 * conserved in these spatial coordinates); far away it is −M n̂/r².
 */
static int rhs_p2(double tau, const double y[], double f[], void *params)
{
	(void)tau;
	(void)params;
	n_evals++;
	const double x = y[0], yy = y[1], z = y[2];
	const double u0 = y[3], ux = y[4], uy = y[5], uz = y[6];
	const double r = sqrt(x * x + yy * yy + z * z);
	const double nx = x / r, ny = yy / r, nz = z / r;
	const double H = 2.0 * P2_M / r;
	const double nu = nx * ux + ny * uy + nz * uz;
	const double w = u0 + nu;
	const double S = ux * ux + uy * uy + uz * uz - nu * nu - nu * w;
	const double hr = H / r;
	const double a = -hr * (S + 0.5 * (1.0 - H) * w * w);
	f[0] = ux;
	f[1] = uy;
	f[2] = uz;
	f[3] = hr * (S - 0.5 * H * w * w);
	f[4] = a * nx;
	f[5] = a * ny;
	f[6] = a * nz;
	return GSL_SUCCESS;
}

/* ---------- small vector functions ---------- */

static double dot3(const double a[3], const double b[3])
{
	return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

static double norm3(const double a[3]) { return sqrt(dot3(a, a)); }

/* angle between a and b, accurate for small angles */
static double angle3(const double a[3], const double b[3])
{
	double c[3] = {a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2],
		       a[0] * b[1] - a[1] * b[0]};
	return atan2(norm3(c), dot3(a, b));
}

/*
 * Line geometry of the straight line through position x⃗ along p̂: the
 * longitudinal coordinate s = x⃗·p̂, the perpendicular vector x⃗_⊥ and, for
 * the half line towards infinity on the side of s (sign σ = sign s), the
 * integrals over that half line of the given powers, in closed form
 * (r = √(d² + s²), d = |x⃗_⊥|, r₀ = |x⃗|):
 *     I1 = ∫ ds/r³    = 1/(r₀ (r₀ + |s|)),
 *     I2 = ∫ s ds/r⁴  = σ/(2 r₀²),
 *     I3 = ∫ s² ds/r⁵ = (r₀² + r₀|s| + s²)/(3 (r₀ + |s|) r₀³).
 * (The forms avoid the cancellation of 1 − |s|/r₀ at large r₀.)
 */
struct line {
	double perp[3];
	double I1, I2, I3;
};

static struct line line_through(const double x[3], const double p[3])
{
	struct line L;
	const double pn = norm3(p);
	double ph[3] = {p[0] / pn, p[1] / pn, p[2] / pn};
	const double s = dot3(x, ph), as = fabs(s);
	const double r0 = norm3(x);
	for (int i = 0; i < 3; i++)
		L.perp[i] = x[i] - s * ph[i];
	L.I1 = 1.0 / (r0 * (r0 + as));
	L.I2 = (s >= 0 ? 1.0 : -1.0) / (2.0 * r0 * r0);
	L.I3 = (r0 * r0 + r0 * as + s * s) / (3.0 * (r0 + as) * r0 * r0 * r0);
	return L;
}

/*
 * Asymptotic direction from an end state (x⃗, p⃗) of P1: the first-order
 * transverse impulse of the Coulomb force κ r⃗/r³ along the straight line
 * with speed v = |p|/√(m² + p²) is (κ x⃗_⊥/v) I1 (Rutherford's
 * straight-line impulse, integrated in closed form). sign = −1 removes the
 * incoming tail (start state), +1 adds the outgoing one (stop state).
 */
static void asym_p1(const double x[3], const double p[3], double sign, double d[3])
{
	struct line L = line_through(x, p);
	const double pn = norm3(p);
	const double v = pn / sqrt(MASS * MASS + pn * pn);
	for (int i = 0; i < 3; i++)
		d[i] = p[i] + sign * (P1_KAPPA / v) * L.I1 * L.perp[i];
}

/*
 * Asymptotic direction from an end state of P2. In Hamiltonian form with
 * covariant momenta p_μ (p_t = −E conserved) the geodesic equation reads
 * dp_i/dτ = (1/2m) ∂_i[H (E + n̂·p⃗)²] (g^μν = η^μν − H l^μ l^ν,
 * l^μ p_μ = E + n̂·p⃗). Its transverse part, integrated at first order in M
 * along the straight line (dτ = m ds/|p|, n̂·p⃗ = |p| s/r), is
 *     Δp⃗_⊥ = −(M x⃗_⊥/|p|) [E² I1 + 4 E |p| I2 + 3 |p|² I3].
 * Over the whole line this is the 1PM angle 2M(1 + v²)/(v² b) (Einstein's
 * light bending at v = 1). The covariant spatial momentum is used at both
 * ends: it tends to p⃗ at infinity and its tail is the one integrated here.
 */
static void asym_p2(const double x[3], const double pc[3], double E, double sign,
		    double d[3])
{
	struct line L = line_through(x, pc);
	const double P = norm3(pc);
	const double k = -(P2_M / P) * (E * E * L.I1 + 4.0 * E * P * L.I2 + 3.0 * P * P * L.I3);
	for (int i = 0; i < 3; i++)
		d[i] = pc[i] + sign * k * L.perp[i];
}

/* covariant spatial momentum p_i = m [u^i + H n_i (u⁰ + n̂·u⃗)] of a P2 state */
static void cov_p2(const double y[], double pc[3])
{
	const double r = norm3(y);
	const double H = 2.0 * P2_M / r;
	const double w = y[3] + (y[0] * y[4] + y[1] * y[5] + y[2] * y[6]) / r;
	for (int i = 0; i < 3; i++)
		pc[i] = MASS * (y[4 + i] + H * (y[i] / r) * w);
}

/* ---------- one trajectory ---------- */

struct result {
	double chi;
	long evals;
	int ok; /* 1: reached r ≥ R outbound */
};

static double now(void)
{
	struct timespec ts;
	clock_gettime(CLOCK_MONOTONIC, &ts);
	return ts.tv_sec + 1e-9 * ts.tv_nsec;
}

static struct result trajectory(int problem, double tol, double Rb)
{
	struct result res = {NAN, 0, 0};
	double y[7] = {0};
	int dim;
	double R, E, vinf, b;
	gsl_odeiv2_system sys;
	double d_in[3];

	n_evals = 0;
	if (problem == 1) {
		dim = 6;
		vinf = P1_V;
		b = P1_B;
		R = Rb * b;
		const double g = 1.0 / sqrt(1.0 - vinf * vinf);
		E = g * MASS;
		const double pinf = g * MASS * vinf, L = pinf * b;
		/* exact energy at r = R: √(m² + P²) + κ/R = E */
		const double ek = E - P1_KAPPA / R;
		const double P = sqrt(ek * ek - MASS * MASS);
		const double y0 = L / P;
		y[0] = -sqrt(R * R - y0 * y0);
		y[1] = y0;
		y[3] = P;
		asym_p1(y, y + 3, -1.0, d_in);
		sys = (gsl_odeiv2_system){rhs_p1, NULL, 6, NULL};
	} else {
		dim = 7;
		vinf = P2_V;
		b = P2_B;
		R = Rb * b;
		const double g = 1.0 / sqrt(1.0 - vinf * vinf);
		E = g * MASS;
		const double pinf = g * MASS * vinf, L = pinf * b;
		/*
		 * Covariant momentum p⃗ = P x̂ at (x₀, y₀, 0), |x⃗| = R, with the
		 * exact energy (p_t = −E) and angular momentum (−y₀ P = −L):
		 * the mass shell g^μν p_μ p_ν = −m² reads
		 *     P² − H (E + P x₀/R)² = E² − m²,   y₀ = L/P,
		 * solved by fixed-point iteration (contraction factor O(H)).
		 */
		const double H = 2.0 * P2_M / R;
		double P = pinf, x0 = -R, y0 = 0;
		for (int it = 0; it < 100; it++) {
			y0 = L / P;
			x0 = -sqrt(R * R - y0 * y0);
			const double wc = E + P * x0 / R;
			const double Pn = sqrt(pinf * pinf + H * wc * wc);
			if (fabs(Pn - P) <= 1e-16 * P) {
				P = Pn;
				break;
			}
			P = Pn;
		}
		y0 = L / P;
		x0 = -sqrt(R * R - y0 * y0);
		const double wc = E + P * x0 / R; /* l^μ p_μ */
		/* raise: p^0 = E + H wc, p^i = p_i − H n_i wc */
		y[0] = x0;
		y[1] = y0;
		y[3] = (E + H * wc) / MASS;
		y[4] = (P - H * (x0 / R) * wc) / MASS;
		y[5] = (-H * (y0 / R) * wc) / MASS;
		double pc[3] = {P, 0, 0};
		asym_p2(y, pc, E, -1.0, d_in);
		sys = (gsl_odeiv2_system){rhs_p2, NULL, 7, NULL};
	}

	const gsl_odeiv2_step_type *T = gsl_odeiv2_step_rk8pd;
	gsl_odeiv2_step *s = gsl_odeiv2_step_alloc(T, dim);
	gsl_odeiv2_control *c = gsl_odeiv2_control_y_new(tol, tol);
	gsl_odeiv2_evolve *e = gsl_odeiv2_evolve_alloc(dim);
	gsl_odeiv2_step_set_driver(s, NULL);

	/* A generous bound on the time to reach R again (straight line: 2R/v). */
	double t = 0, t1 = 10.0 * R / vinf;
	/* Initial step: a small fraction of the local time scale r/v. */
	double h = 1e-3 * R / vinf;
	long steps;
	for (steps = 0; steps < 10000000; steps++) {
		int st = gsl_odeiv2_evolve_apply(e, c, s, &sys, &t, t1, &h, y);
		if (st != GSL_SUCCESS)
			break;
		const double r = norm3(y);
		const double rdot = (problem == 1) ? dot3(y, y + 3) : dot3(y, y + 4);
		if (r >= R && rdot > 0) {
			res.ok = 1;
			break;
		}
		if (t >= t1)
			break;
	}
	gsl_odeiv2_evolve_free(e);
	gsl_odeiv2_control_free(c);
	gsl_odeiv2_step_free(s);

	if (res.ok) {
		double d_out[3];
		if (problem == 1) {
			asym_p1(y, y + 3, +1.0, d_out);
		} else {
			double pc[3];
			cov_p2(y, pc);
			asym_p2(y, pc, E, +1.0, d_out);
		}
		res.chi = angle3(d_in, d_out);
	}
	res.evals = n_evals;
	return res;
}

static int cmp_double(const void *a, const void *b)
{
	double x = *(const double *)a, y = *(const double *)b;
	return (x > y) - (x < y);
}

/* parse a comma-separated list of numbers */
static int parse_list(const char *s, double *out, int max)
{
	int n = 0;
	char *buf = strdup(s), *save = NULL;
	for (char *tok = strtok_r(buf, ",", &save); tok && n < max;
	     tok = strtok_r(NULL, ",", &save)) {
		char *end;
		errno = 0;
		double v = strtod(tok, &end);
		if (errno || end == tok || *end != '\0' || !(v > 0)) {
			fprintf(stderr, "peer: bad number \"%s\" in list \"%s\"\n", tok, s);
			free(buf);
			exit(2);
		}
		out[n++] = v;
	}
	free(buf);
	return n;
}

static void usage(void)
{
	fprintf(stderr,
		"usage: peer [--problem 1|2|all] [--tols LIST] [--radii LIST]\n"
		"            [--repeats N] [--chi1 X] [--chi2 X] [--time coord|proper]\n"
		"  LIST is comma-separated; radii in units of b (default 1e3,1e4,1e5);\n"
		"  tols default 1e-8,...,1e-14; chi1/chi2 are the exact deflections\n"
		"  used for the abs_err column (NaN if not given).\n");
	exit(2);
}

int main(int argc, char **argv)
{
	double tols[64], radii[64];
	int ntol = parse_list("1e-8,1e-9,1e-10,1e-11,1e-12,1e-13,1e-14", tols, 64);
	int nrad = parse_list("1e3,1e4,1e5", radii, 64);
	int repeats = 5, pmin = 1, pmax = 2;
	double chi_exact[3] = {NAN, NAN, NAN};

	for (int i = 1; i < argc; i++) {
		const char *a = argv[i];
		if (i + 1 >= argc)
			usage();
		const char *v = argv[++i];
		if (!strcmp(a, "--problem")) {
			if (!strcmp(v, "all"))
				pmin = 1, pmax = 2;
			else if (!strcmp(v, "1"))
				pmin = pmax = 1;
			else if (!strcmp(v, "2"))
				pmin = pmax = 2;
			else
				usage();
		} else if (!strcmp(a, "--tols")) {
			ntol = parse_list(v, tols, 64);
		} else if (!strcmp(a, "--radii")) {
			nrad = parse_list(v, radii, 64);
		} else if (!strcmp(a, "--repeats")) {
			repeats = atoi(v);
			if (repeats < 1)
				usage();
		} else if (!strcmp(a, "--chi1")) {
			chi_exact[1] = strtod(v, NULL);
		} else if (!strcmp(a, "--chi2")) {
			chi_exact[2] = strtod(v, NULL);
		} else if (!strcmp(a, "--time")) {
			if (!strcmp(v, "proper"))
				proper_time = 1;
			else if (strcmp(v, "coord"))
				usage();
		} else {
			usage();
		}
	}
	gsl_set_error_handler_off();

	double *times = malloc(sizeof(double) * repeats);
	printf("code\tproblem\ttol\tR\tevals\tmedian_seconds\tchi\tchi_exact\tabs_err\tstatus\n");
	for (int p = pmin; p <= pmax; p++) {
		for (int ir = 0; ir < nrad; ir++) {
			for (int it = 0; it < ntol; it++) {
				struct result res = {0};
				for (int k = 0; k < repeats; k++) {
					double t0 = now();
					res = trajectory(p, tols[it], radii[ir]);
					times[k] = now() - t0;
				}
				qsort(times, repeats, sizeof(double), cmp_double);
				double med = (repeats % 2) ? times[repeats / 2]
							   : 0.5 * (times[repeats / 2 - 1] + times[repeats / 2]);
				printf("peer\tP%d\t%.0e\t%.0e\t%ld\t%.4e\t%.15f\t%.15f\t%.3e\t%s\n", p,
				       tols[it], radii[ir], res.evals, med, res.chi, chi_exact[p],
				       fabs(res.chi - chi_exact[p]), res.ok ? "scattered" : "failed");
				fflush(stdout);
			}
		}
	}
	free(times);
	return 0;
}
