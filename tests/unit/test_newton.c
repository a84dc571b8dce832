/* The Newton workspace's kernels against SUNDIALS itself: the short-vector
** operations installed in the N_Vector table (vecops.c) and the dense LU
** solve must give the results of SUNDIALS's serial vector and of
** SUNDlsMat_denseGETRS to the last bit, on random data and on the special
** cases those routines treat apart. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "newton_impl.h"
#include <sundials/sundials_dense.h>

/* A fixed linear congruential sequence: the same data on every run. */
static uint64_t seed = 88172645463325252ull;
static double next(void)
{
  seed = seed * 6364136223846793005ull + 1442695040888963407ull;
  return (double)(seed >> 11) / 9007199254740992.0 * 2 - 1;    /* [-1, 1) */
}

static void same_bits(const double *a, const double *b, int n, const char *what)
{
  if (memcmp(a, b, sizeof(double) * (size_t)n) != 0)
    for (int i = 0; i < n; i++)
      if (memcmp(&a[i], &b[i], sizeof(double)) != 0)
        fail_msg("%s: element %d is %.17g, SUNDIALS gives %.17g", what, i, a[i], b[i]);
}

static void same_value(double a, double b, const char *what)
{
  if (memcmp(&a, &b, sizeof a) != 0) fail_msg("%s: %.17g, SUNDIALS gives %.17g", what, a, b);
}

static void test_dense_solve(void **state)
{
  double A[20 * 20], F[20 * 20], b1[20], b2[20];
  double *cols[20];
  sunindextype piv[20];
  for (int n = 1; n <= 20; n++)
    for (int trial = 0; trial < 200; trial++) {
      for (int j = 0; j < n * n; j++) A[j] = next();
      if (trial % 7 == 0) A[0] = 0;                   /* a pivot must move */
      memcpy(F, A, sizeof(double) * (size_t)(n * n));
      for (int j = 0; j < n; j++) cols[j] = F + j * n;
      if (SUNDlsMat_denseGETRF(cols, n, n, piv) != 0) continue;   /* singular: no solve */
      for (int i = 0; i < n; i++) b1[i] = b2[i] = next() * 1e3;
      SUNDlsMat_denseGETRS(cols, n, piv, b1);
      eqpi_dense_getrs(cols, n, piv, b2);
      same_bits(b2, b1, n, "dense solve");
    }
}

static void fill(N_Vector v, int n)
{
  for (int i = 0; i < n; i++) NV_Ith_S(v, i) = next() * (i % 3 == 0 ? 1e-8 : 10);
}

/* Each operation on a pair of vectors, one with SUNDIALS's serial kernels
** and one with ours, from the same data. */
static void test_vector_kernels(void **state)
{
  SUNContext sun;
  assert_int_equal(SUNContext_Create(NULL, &sun), 0);
  const double coef[] = {1, -1, 2.5, -0.75, 0};
  for (int n = 1; n <= 9; n++) {
    N_Vector x = N_VNew_Serial(n, sun), y = N_VNew_Serial(n, sun), w = N_VNew_Serial(n, sun);
    N_Vector zs = N_VNew_Serial(n, sun), zo = N_VNew_Serial(n, sun);
    N_Vector xo = N_VNew_Serial(n, sun), yo = N_VNew_Serial(n, sun);
    eqpi_vec_install(zo);
    eqpi_vec_install(xo);
    eqpi_vec_install(yo);
    for (int trial = 0; trial < 50; trial++) {
      fill(x, n);
      fill(y, n);
      fill(w, n);
      for (int i = 0; i < n; i++) NV_Ith_S(w, i) = fabs(NV_Ith_S(w, i)) + 0.5;
      for (int ia = 0; ia < 5; ia++)
        for (int ib = 0; ib < 5; ib++) {
          double a = coef[ia], b = coef[ib];
          N_VLinearSum_Serial(a, x, b, y, zs);                /* z apart */
          N_VScale(1, x, xo);
          N_VScale(1, y, yo);
          N_VLinearSum(a, xo, b, yo, zo);
          same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "linear sum");
          N_VScale_Serial(1, y, zs);                          /* into y */
          N_VLinearSum_Serial(a, x, b, zs, zs);
          N_VScale(1, y, zo);
          N_VLinearSum(a, xo, b, zo, zo);
          same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "linear sum into y");
          N_VScale_Serial(1, x, zs);                          /* into x */
          N_VLinearSum_Serial(a, zs, b, y, zs);
          N_VScale(1, x, zo);
          N_VLinearSum(a, zo, b, yo, zo);
          same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "linear sum into x");
        }
      N_VScale(1, x, xo);
      N_VScale(1, y, yo);
      for (int ic = 0; ic < 5; ic++) {
        N_VScale_Serial(coef[ic], x, zs);
        N_VScale(coef[ic], xo, zo);
        same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "scale");
        N_VScale(1, x, zo);                                   /* in place */
        N_VScale(coef[ic], zo, zo);
        same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "scale in place");
        N_VConst_Serial(coef[ic], zs);
        N_VConst(coef[ic], zo);
        same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "const");
      }
      N_VProd_Serial(x, y, zs);
      N_VProd(xo, yo, zo);
      same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "product");
      N_VDiv_Serial(x, w, zs);
      N_VScale(1, w, yo);
      N_VDiv(xo, yo, zo);
      same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "quotient");
      N_VAbs_Serial(x, zs);
      N_VAbs(xo, zo);
      same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "abs");
      N_VInv_Serial(w, zs);
      N_VInv(yo, zo);
      same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "inverse");
      N_VScale(1, y, yo);
      same_value(N_VDotProd(xo, yo), N_VDotProd_Serial(x, y), "dot product");
      same_value(N_VMaxNorm(xo), N_VMaxNorm_Serial(x), "max norm");
      same_value(N_VMin(xo), N_VMin_Serial(x), "min");
      N_VScale(1, w, yo);
      same_value(N_VWL2Norm(xo, yo), N_VWL2Norm_Serial(x, w), "weighted l2 norm");
      for (int nv = 1; nv <= 3; nv++) {                       /* combinations */
        double c[3] = {coef[trial % 5], coef[(trial + 1) % 5], coef[(trial + 2) % 5]};
        N_Vector Xs[3] = {x, y, w}, Xo[3] = {xo, yo, NULL};
        N_Vector wo = N_VNew_Serial(n, sun);
        eqpi_vec_install(wo);
        N_VScale(1, w, wo);
        N_VScale(1, y, yo);
        Xo[2] = wo;
        assert_int_equal(N_VLinearCombination_Serial(nv, c, Xs, zs), 0);
        assert_int_equal(N_VLinearCombination(nv, c, Xo, zo), 0);
        same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "linear combination");
        N_VScale_Serial(1, x, zs);                            /* z is the first vector */
        Xs[0] = zs;
        assert_int_equal(N_VLinearCombination_Serial(nv, c, Xs, zs), 0);
        N_VScale(1, x, zo);
        Xo[0] = zo;
        assert_int_equal(N_VLinearCombination(nv, c, Xo, zo), 0);
        same_bits(NV_DATA_S(zo), NV_DATA_S(zs), n, "linear combination into the first");
        N_VDestroy(wo);
      }
    }
    N_VDestroy(x);
    N_VDestroy(y);
    N_VDestroy(w);
    N_VDestroy(zs);
    N_VDestroy(zo);
    N_VDestroy(xo);
    N_VDestroy(yo);
  }
  SUNContext_Free(&sun);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_dense_solve),
    cmocka_unit_test(test_vector_kernels),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
