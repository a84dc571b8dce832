/* The equilibrium problem: rows, unknowns and the residual.
**
** Unknowns are x_c = ln m_c of each component's free molality, the amounts
** of reagents that are unknowns, and ln I. Species follow from mass action:
**   ln m_i = ln K_i + sum_c nu_ic (x_c + ln g_c) - ln g_i
** A mass balance is scaled by sum_i |nu_ic| m_i so every row is O(1); a
** fixed activity reads x_c + ln g_c - ln a_c; the charge balance is scaled
** by sum_i |z_i| m_i; the ionic strength row is ln(1/2 sum z^2 m) - ln I.
** Components that form no species but their own (spectators such as Na+
** in a phosphate buffer) are fixed at their totals and are not unknowns. */
/* SPDX-License-Identifier: MIT */
#include "problem_impl.h"
#include <math.h>
#include <stdio.h>
#include <string.h>

#define LNMAX 700.0      /* keep exp() finite during wild iterates */
#define TINY 1e-300

static inline double clamp_exp(double s) { return exp(s > LNMAX ? LNMAX : s); }

typedef struct pcarver { char *base; size_t used; } pcarver;

static void *pcarve(pcarver *k, size_t n)
{
  k->used = (k->used + 15) & ~(size_t)15;
  void *p = k->base ? k->base + k->used : NULL;
  k->used += n ? n : 1;
  return p;
}

static void carve_problem(pcarver *k, eqpi_problem *P, int nc, int ns, int nmax)
{
#define D(p, n) ((p) = pcarve(k, sizeof(double) * (size_t)(n)))
  D(P->lna, nc); D(P->tot, nc); D(P->lnfix, nc); D(P->N0, nc); D(P->href, nc);
  D(P->logx, nc); D(P->logv, nc);
  D(P->lnfree, nc); D(P->lngc, nc);
  D(P->coefH, ns); D(P->s0, ns); D(P->mid, ns); D(P->lg, ns); D(P->lng, ns); D(P->m, ns);
  D(P->dlng, ns);
  D(P->u_at, nmax); D(P->F, nmax); D(P->S, nmax);
  for (int j = 0; j < 4; j++) D(P->w_ns[j], ns);
  for (int j = 0; j < 3; j++) D(P->w_nc[j], nc);
  D(P->w_n, nmax);
  for (int j = 0; j < EQPI_MAX_AMOUNTS; j++) D(P->amt[j].a, nc);
  for (int j = 0; j < EQPI_MAX_AMOUNTS; j++) D(P->amt[j].b, nc);
#undef D
  P->xidx = pcarve(k, sizeof(int) * (size_t)nc);
  P->xcomp = pcarve(k, sizeof(int) * (size_t)nmax);
  P->kind = pcarve(k, (size_t)nc);
}

static int info_param(const void *ud, size_t i, const char *key, double *v)
{
  const eqpi_problem *P = ud;
  return eqpi_db_species_param(P->tab->db, P->tab->sp[i], key, v);
}

static int info_pair(const void *ud, size_t i, size_t j, const char *key, double *v)
{
  const eqpi_problem *P = ud;
  return eqpi_db_pair_param(P->tab->db, P->tab->sp[i], P->tab->sp[j], key, v);
}

int eqpi_problem_set_model(eqpi_problem *P, eqpi_model *model)
{
  P->model = model;
  P->derivs = eqpi_model_derivs(model);
  P->at_ok = 0;
  if (P->bound == model) return EQP_OK;
  /* tell the model which species are present (optional op of the ABI) */
  const eqpi_tableau *t = P->tab;
  eqp_species_info info = {(size_t)t->ns, t->names, t->z, t->size, P, info_param, info_pair};
  char err[256] = "";
  if (eqpi_model_bind(model, &info, P->bind_warn, sizeof P->bind_warn, err, sizeof err) != 0) {
    P->bound = NULL;
    return eqpi_fail(P->ctx, EQP_E_PLUGIN, "activity model '%s': %s", model->desc->name,
                     err[0] ? err : "bind failed");
  }
  P->bound = model;
  return EQP_OK;
}

eqpi_problem *eqpi_problem_new(eqp_ctx *ctx, const eqpi_tableau *tab, eqpi_model *model)
{
  int nc = tab->nc, ns = tab->ns, nmax = nc + EQPI_MAX_AMOUNTS + 1;
  pcarver k = {NULL, sizeof(eqpi_problem)};
  eqpi_problem tmp;
  carve_problem(&k, &tmp, nc, ns, nmax);
  eqpi_problem *P = eqpi_calloc(ctx, 1, k.used);
  if (!P) return eqpi_fail(ctx, EQP_E_NOMEM, "out of memory"), NULL;
  P->bytes = k.used;
  k.base = (char *)P;
  k.used = sizeof(eqpi_problem);
  carve_problem(&k, P, nc, ns, nmax);
  P->ctx = ctx;
  P->tab = tab;
  P->nmax = nmax;
  P->lambda = 1;
  for (int c = 0; c < nc; c++) P->logx[c] = NAN;       /* no log taken yet */
  for (int i = 0; i < ns; i++) P->coefH[i] = eqpi_tableau_nu(tab, i, tab->hloc);  /* href = 0 */
  eqpi_problem_layout(P);
  if (eqpi_problem_set_model(P, model) < 0) {
    eqpi_problem_free(P);
    return NULL;
  }
  return P;
}

void eqpi_problem_free(eqpi_problem *P)
{
  if (P) eqpi_free(P->ctx, P, P->bytes);
}

void eqpi_problem_set_totals(eqpi_problem *P, const double *totals)
{
  const eqpi_tableau *t = P->tab;
  for (int c = 0; c < t->nc; c++) {
    if (P->kind[c] != EQPI_ROW_MASS) continue;
    P->tot[c] = totals[t->comp[c]];
    /* most totals are those of the last solve: their log is at hand */
    double x = P->tot[c] > 0 ? P->tot[c] : TINY;
    if (x != P->logx[c]) {
      P->logx[c] = x;
      P->logv[c] = log(x);
    }
    P->lnfix[c] = P->logv[c];
  }
  P->at_ok = 0;
}

void eqpi_problem_set_row(eqpi_problem *P, int c, int kind, double lna)
{
  P->kind[c] = (unsigned char)kind;
  P->lna[c] = lna;
  P->at_ok = 0;
}

int eqpi_problem_add_amount(eqpi_problem *P, const double *N0, double W0, const double *a,
                            double w, double scale, int target, int molal, double ln_target)
{
  const eqpi_tableau *t = P->tab;
  if (P->na >= EQPI_MAX_AMOUNTS) return -1;
  if (P->na == 0) {
    for (int c = 0; c < t->nc; c++) P->N0[c] = N0[t->comp[c]];
    P->W0 = W0;
  }
  eqpi_amount *A = &P->amt[P->na++];
  for (int c = 0; c < t->nc; c++) A->a[c] = a[t->comp[c]];
  A->w = w;
  A->scale = scale;
  A->target = target;
  A->molal = molal;
  A->ln_target = ln_target;
  A->name = NULL;
  P->at_ok = 0;
  return 0;
}

int eqpi_problem_add_solid(eqpi_problem *P, const double *N0, double W0, const double *a,
                           double scale, const double *b, double ln_target, const char *name)
{
  if (eqpi_problem_add_amount(P, N0, W0, a, 0, scale, EQPI_TARGET_SOLID, 0, ln_target) < 0)
    return -1;
  eqpi_amount *A = &P->amt[P->na - 1];
  memcpy(A->b, b, sizeof(double) * (size_t)P->tab->nc);
  A->name = name;
  return 0;
}

void eqpi_problem_clear_amounts(eqpi_problem *P)
{
  P->na = 0;
  P->at_ok = 0;
}

/* A spectator forms no species but its own, has its total given, and is
** no amount's target: its molality is its total, whatever the others do. */
static int spectator(const eqpi_problem *P, int c)
{
  const eqpi_tableau *t = P->tab;
  if (P->kind[c] != EQPI_ROW_MASS || c == t->hloc || t->col[c + 1] - t->col[c] != 1) return 0;
  for (int k = 0; k < P->na; k++)
    if (P->amt[k].target == t->comp_sp[c]) return 0;
  return 1;
}

void eqpi_problem_layout(eqpi_problem *P)
{
  const eqpi_tableau *t = P->tab;
  P->nx = 0;
  for (int c = 0; c < t->nc; c++) {
    if (spectator(P, c)) {
      P->xidx[c] = -1;
    } else {
      P->xidx[c] = P->nx;
      P->xcomp[P->nx++] = c;
    }
  }
  P->n = P->nx + P->na + 1;
  P->at_ok = 0;
}

/* ------------------------------------------------------------ residual */

/* Totals and the spectators' molalities at the amounts of u. */
static void amount_totals(eqpi_problem *P, const double *u)
{
  const eqpi_tableau *t = P->tab;
  double W = P->W0;
  for (int k = 0; k < P->na; k++) W += u[P->nx + k] * P->amt[k].scale * P->amt[k].w;
  P->W = W;
  for (int c = 0; c < t->nc; c++) {
    double N = P->N0[c];
    for (int k = 0; k < P->na; k++) N += u[P->nx + k] * P->amt[k].scale * P->amt[k].a[c];
    if (P->kind[c] == EQPI_ROW_MASS) P->tot[c] = N / W;
    if (P->xidx[c] < 0) P->lnfix[c] = log(P->tot[c] > TINY ? P->tot[c] : TINY);
  }
}

/* Activity coefficients at I for the mass-action molalities mid. */
static int model_pass(eqpi_problem *P, double I)
{
  const eqpi_tableau *t = P->tab;
  const int ns = t->ns;
  if (P->lambda == 0) {
    memset(P->lg, 0, sizeof(double) * (size_t)ns);
    memset(P->lng, 0, sizeof(double) * (size_t)ns);
    return 0;
  }
  eqp_activity_in in = {(size_t)ns, t->z, t->size, P->mid, I, t->T, t->A, t->B};
  if (eqpi_model_log_gamma(P->model, &in, P->lg, P->plugin_err, sizeof P->plugin_err) != 0) {
    P->plugin_failed = 1;
    return -1;
  }
  const double f = P->lambda * EQPI_LN10;
  for (int i = 0; i < ns; i++) {
    if (!isfinite(P->lg[i])) {
      P->plugin_failed = 1;
      strcpy(P->plugin_err, "activity model returned a non-finite log gamma");
      return -1;
    }
    P->lng[i] = f * P->lg[i];
  }
  return 0;
}

/* A mass-balance row: R = sum c_i m_i - T, S = sum |c_i| m_i. */
static double mass_row(const eqpi_problem *P, int c, double *Sout)
{
  const eqpi_tableau *t = P->tab;
  double R, S = 0;
  if (c == t->hloc) {
    R = -P->tot[c];
    for (int d = 0; d < t->nc; d++) R += P->href[d] * P->tot[d];
    for (int i = 0; i < t->ns; i++) {
      double v = P->coefH[i] * P->m[i];
      R += v;
      S += fabs(v);
    }
  } else {
    R = -P->tot[c];
    for (int k = t->col[c]; k < t->col[c + 1]; k++) {
      double v = t->cnu[k] * P->m[t->csp[k]];
      R += v;
      S += fabs(v);
    }
  }
  *Sout = S > TINY ? S : TINY;
  return R / *Sout;
}

static double charge_row(const eqpi_problem *P, double *Sout)
{
  const eqpi_tableau *t = P->tab;
  double q = 0, S = 0;
  for (int i = 0; i < t->ns; i++) {
    q += t->z[i] * P->m[i];
    S += fabs(t->z[i]) * P->m[i];
  }
  *Sout = S > TINY ? S : TINY;
  return q / *Sout;
}

/* ln a of species X at the state of the last evaluation. */
static double ln_activity(const eqpi_problem *P, int X)
{
  const eqpi_tableau *t = P->tab;
  double s = t->lnK[X];
  for (int k = t->row[X]; k < t->row[X + 1]; k++)
    s += t->nu[k] * (P->lnfree[t->cmp[k]] + P->lngc[t->cmp[k]]);
  return s;
}

/* sum_c b_c ln a_c of a solid's row: the ln IAP less the log K of its species. */
static double solid_sum(const eqpi_problem *P, const eqpi_amount *A)
{
  double s = 0;
  for (int c = 0; c < P->tab->nc; c++)
    if (A->b[c] != 0) s += A->b[c] * (P->lnfree[c] + P->lngc[c]);
  return s;
}

/* The rows at the state of the last evaluation (molalities, free
** components, totals), from the balances themselves. */
static void rows(eqpi_problem *P, const double *u, double *F)
{
  const int nx = P->nx, n = P->n;
  const double lnI = u[n - 1], Ic = P->Ic;
  for (int k = 0; k < nx; k++) {
    int c = P->xcomp[k];
    switch (P->kind[c]) {
    case EQPI_ROW_ACTIVITY:
      F[k] = P->lnfree[c] + P->lngc[c] - P->lna[c];
      P->S[k] = 1;
      break;
    case EQPI_ROW_CHARGE:
      F[k] = charge_row(P, &P->S[k]);
      break;
    default:
      F[k] = mass_row(P, c, &P->S[k]);
    }
  }
  for (int k = 0; k < P->na; k++) {
    const eqpi_amount *A = &P->amt[k];
    double v = A->target == EQPI_TARGET_IONIC ? lnI
               : A->target == EQPI_TARGET_SOLID ? solid_sum(P, A) : ln_activity(P, A->target);
    if (A->molal && A->target >= 0) v -= P->lng[A->target];
    F[nx + k] = v - A->ln_target;
    P->S[nx + k] = 1;
  }
  F[n - 1] = log(Ic > TINY ? Ic : TINY) - lnI;
  P->S[n - 1] = 1;
}

int eqpi_problem_eval(eqpi_problem *P, const double *u, double *F)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns, n = P->n;
  P->at_ok = 0;
  /* a non-finite iterate cannot be evaluated; stop the solve (the caller
  ** falls back) rather than let NaN through KINSOL's line search */
  for (int k = 0; k < n; k++)
    if (!isfinite(u[k])) {
      snprintf(P->plugin_err, sizeof P->plugin_err, "non-finite iterate");
      return -2;
    }
  if (P->na) amount_totals(P, u);
  for (int c = 0; c < nc; c++) P->lnfree[c] = P->xidx[c] < 0 ? P->lnfix[c] : u[P->xidx[c]];
  double lnI = u[n - 1], I = exp(lnI);
  double Ic = 0;
  if (P->derivs == EQPI_DERIV_I && P->lambda != 0) {
    /* a model of I alone (it gives d lg/dI) does not read the mass-action
    ** molalities: gamma first, then the molalities in one pass */
    if (model_pass(P, I) < 0) return -1;
    for (int c = 0; c < nc; c++) P->w_nc[0][c] = P->lnfree[c] + P->lng[t->comp_sp[c]];
    for (int i = 0; i < ns; i++) {
      double s = t->lnK[i] - P->lng[i];
      for (int k = t->row[i]; k < t->row[i + 1]; k++) s += t->nu[k] * P->w_nc[0][t->cmp[k]];
      P->m[i] = clamp_exp(s);
      Ic += t->z2[i] * P->m[i];
    }
  } else {
    for (int i = 0; i < ns; i++) {
      double s = t->lnK[i];
      for (int k = t->row[i]; k < t->row[i + 1]; k++) s += t->nu[k] * P->lnfree[t->cmp[k]];
      P->s0[i] = s;
      P->mid[i] = clamp_exp(s);
    }
    if (model_pass(P, I) < 0) return -1;
    for (int i = 0; i < ns; i++) {
      double s = P->s0[i] - P->lng[i];
      for (int k = t->row[i]; k < t->row[i + 1]; k++) s += t->nu[k] * P->lng[t->comp_sp[t->cmp[k]]];
      P->m[i] = clamp_exp(s);
      Ic += t->z2[i] * P->m[i];
    }
  }
  for (int c = 0; c < nc; c++) P->lngc[c] = P->lng[t->comp_sp[c]];
  Ic *= 0.5;
  P->I = I;
  P->Ic = Ic;
  rows(P, u, F);
  eqpi_vcopy(P->u_at, u, n);
  if (F != P->F) eqpi_vcopy(P->F, F, n);
  P->at_ok = 1;
  return 0;
}

int eqpi_problem_at(eqpi_problem *P, const double *u)
{
  if (P->at_ok && eqpi_vsame(P->u_at, u, P->n)) return 0;
  return eqpi_problem_eval(P, u, P->F);
}

/* ------------------------------------------------------------ around it */

/* For each unknown component other than H+, the species made of it and H+
** alone that is most abundant now; its protons per unit of the component
** become the reference of the H+ row. */
int eqpi_problem_reference(eqpi_problem *P)
{
  const eqpi_tableau *t = P->tab;
  const int nc = t->nc, ns = t->ns, h = t->hloc;
  int changed = 0;
  for (int c = 0; c < nc; c++) {
    double old = P->href[c];
    P->href[c] = 0;
    /* only a mass balance, whose total is given, may be subtracted */
    if (c == h || P->xidx[c] < 0 || P->kind[h] != EQPI_ROW_MASS || P->kind[c] != EQPI_ROW_MASS) {
      changed |= old != 0;
      continue;
    }
    double best = -1;
    for (int k = t->own[c]; k < t->own[c + 1]; k++) {
      int i = t->ownsp[k];
      double nuc = t->ownc[k];
      if (P->m[i] / nuc > best) {
        best = P->m[i] / nuc;
        P->href[c] = t->ownh[k] / nuc;
      }
    }
    changed |= P->href[c] != old;
  }
  if (!changed) return 0;
  for (int i = 0; i < ns; i++) {
    double v = 0;
    for (int k = t->row[i]; k < t->row[i + 1]; k++)
      v += t->cmp[k] == h ? t->nu[k] : -P->href[t->cmp[k]] * t->nu[k];
    P->coefH[i] = v;
  }
  P->at_ok = 0;
  return 1;
}

void eqpi_problem_outputs(eqpi_problem *P)
{
  const eqpi_tableau *t = P->tab;
  for (int c = 0; c < t->nc; c++) {
    if (P->kind[c] == EQPI_ROW_MASS) continue;
    double T = 0;
    for (int k = t->col[c]; k < t->col[c + 1]; k++) T += t->cnu[k] * P->m[t->csp[k]];
    P->tot[c] = T;
  }
}

/* Any non-finite number (a residual, a molality, log gamma) makes the
** result unusable whatever the other rows say: it is reported as an
** infinite residual, never compared (NaN fails every comparison, so a
** running maximum would let a later finite row hide it). */
double eqpi_problem_verify(eqpi_problem *P, const double *u, int *worst)
{
  const eqpi_tableau *t = P->tab;
  double lam = P->lambda;
  int fresh = !(lam == 1 && P->at_ok && eqpi_vsame(P->u_at, u, P->n));
  P->lambda = 1;
  double w = INFINITY;
  *worst = -1;
  /* at the last evaluation the molalities are at hand: the balances are
  ** computed afresh from them against the totals as they are now */
  if (!fresh) rows(P, u, P->F);
  if (!fresh || eqpi_problem_eval(P, u, P->F) == 0) {
    w = 0;
    for (int k = 0; k < P->n && isfinite(w); k++) {
      double r = fabs(P->F[k]);
      if (k == P->n - 1 || k >= P->nx || P->kind[P->xcomp[k]] == EQPI_ROW_ACTIVITY)
        r = fabs(expm1(P->F[k]));   /* ln rows: relative ionic strength, activity */
      if (!(r <= w)) { w = isfinite(r) ? r : INFINITY; *worst = k; }
    }
    /* Charge balance is implied by neutral totals; check it independently. */
    double q = 0, qa = 0;
    for (int i = 0; i < t->ns && isfinite(w); i++) {
      if (!isfinite(P->m[i]) || !isfinite(P->lg[i]) || P->m[i] < 0) {
        w = INFINITY;
        *worst = P->n + 1 + i;
      }
      q += t->z[i] * P->m[i];
      qa += fabs(t->z[i]) * P->m[i];
    }
    double r = qa > 0 ? fabs(q) / qa : 0;
    if (isfinite(w) && !(r <= w)) { w = isfinite(r) ? r : INFINITY; *worst = P->n; }
  }
  P->lambda = lam;
  if (lam != 1) P->at_ok = 0;
  return w;
}

const char *eqpi_problem_row_name(const eqpi_problem *P, int k)
{
  const eqpi_tableau *t = P->tab;
  if (k < 0) return "?";
  if (k < P->nx) return t->names[t->comp_sp[P->xcomp[k]]];
  if (k < P->n - 1) {
    int X = P->amt[k - P->nx].target;
    if (X == EQPI_TARGET_SOLID) return P->amt[k - P->nx].name ? P->amt[k - P->nx].name : "solid";
    return X == EQPI_TARGET_IONIC ? "target ionic strength" : t->names[X];
  }
  if (k > P->n && k - P->n - 1 < t->ns) return t->names[k - P->n - 1];
  return k == P->n - 1 ? "ionic strength" : "charge";
}

double eqpi_problem_ionic_strength(const eqpi_problem *P)
{
  const eqpi_tableau *t = P->tab;
  double I = 0;
  for (int i = 0; i < t->ns; i++) I += 0.5 * t->z2[i] * P->m[i];
  return I;
}
