/* The carbonate equations of L. N. Plummer, E. Busenberg, "The solubilities
** of calcite, aragonite and vaterite in CO2-H2O solutions between 0 and
** 90 C", Geochim. Cosmochim. Acta 46, 1011-1040 (1982), written out once
** for the tests that solve the same equations independently of the engine
** (T in K, log10 T and all). */
/* SPDX-License-Identifier: MIT */
#ifndef EQP_TEST_PB1982_H
#define EQP_TEST_PB1982_H

#include <math.h>

/* K_H = m(CO2*) / p(CO2), mol/(kg atm) */
static inline double pb1982_logKH(double T)
{
  return 108.3865 + 0.01985076 * T - 6919.53 / T - 40.45154 * log10(T) + 669365 / (T * T);
}
/* CO2* + H2O = HCO3- + H+ */
static inline double pb1982_logK1(double T)
{
  return -356.3094 - 0.06091964 * T + 21834.37 / T + 126.8339 * log10(T) - 1684915 / (T * T);
}
/* HCO3- = CO3^2- + H+ */
static inline double pb1982_logK2(double T)
{
  return -107.8871 - 0.03252849 * T + 5151.79 / T + 38.92561 * log10(T) - 563713.9 / (T * T);
}
/* calcite = Ca^2+ + CO3^2- */
static inline double pb1982_logKsp_calcite(double T)
{
  return -171.9065 - 0.077993 * T + 2839.319 / T + 71.595 * log10(T);
}
/* Ca^2+ + HCO3- = CaHCO3+ */
static inline double pb1982_logK_CaHCO3(double T)
{
  return 1209.120 + 0.31294 * T - 34765.05 / T - 478.782 * log10(T);
}
/* Ca^2+ + CO3^2- = CaCO3(aq) */
static inline double pb1982_logK_CaCO3(double T)
{
  return -1228.732 - 0.299444 * T + 35512.75 / T + 485.818 * log10(T);
}

#endif
