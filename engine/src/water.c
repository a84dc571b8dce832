/* Properties of liquid water: density, relative permittivity and the
** Debye-Hueckel A and B parameters. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <math.h>

/* G. S. Kell, "Density, thermal expansivity, and compressibility of liquid
** water from 0 to 150 C", J. Chem. Eng. Data 20, 97-105 (1975), eq. for
** 0.101325 MPa, IPTS-68 temperatures; returns kg/L. */
double eqpi_water_density(double T)
{
  double t = T - 273.15;
  double num = 999.83952 + t * (16.945176 + t * (-7.9870401e-3 + t * (-46.170461e-6 +
               t * (105.56302e-9 + t * -280.54253e-12))));
  return num / (1.0 + 16.879850e-3 * t) / 1000.0;
}

/* C. G. Malmberg and A. A. Maryott, "Dielectric constant of water from 0 to
** 100 C", J. Res. Natl. Bur. Stand. 56, 1-8 (1956). */
double eqpi_water_permittivity(double T)
{
  double t = T - 273.15;
  return 87.740 - 0.40008 * t + 9.398e-4 * t * t - 1.410e-6 * t * t * t;
}

/* Molal-scale A (log10 basis, kg^1/2 mol^-1/2) and B (kg^1/2 mol^-1/2
** per Angstrom) from the Debye-Hueckel theory with CODATA 2018 constants:
** A = 1.824812e6 rho^1/2 (eps T)^-3/2, B = 50.29037 rho^1/2 (eps T)^-1/2. */
void eqpi_debye_huckel_AB(double T, double *A, double *B)
{
  double rho = eqpi_water_density(T);       /* numerically g/cm3 */
  double eT = eqpi_water_permittivity(T) * T;
  if (A) *A = 1.824812e6 * sqrt(rho) / (eT * sqrt(eT));
  if (B) *B = 50.29037 * sqrt(rho) / sqrt(eT);
}

double eqp_water_density(double T) { return eqpi_water_density(T); }

/* A dilute solution's volume is that of its water: kg = L x kg/L. */
double eqp_water_of_volume(double litres, double T) { return litres * eqpi_water_density(T); }

double eqp_molal_of_molar(double molar, double T) { return molar / eqpi_water_density(T); }

/* IAPWS R11-07 (2007), A. V. Bandura and S. N. Lvov, "The ionization
** constant of water over wide ranges of temperature and density",
** J. Phys. Chem. Ref. Data 35, 15-30 (2006); rho in g/cm3, T in K. */
double eqpi_water_pKw_rho(double T, double rho)
{
  const double n = 6, a0 = -0.864671, a1 = 8659.19, a2 = -22786.2;
  const double b0 = 0.642044, b1 = -56.8534, b2 = -0.375754;
  const double g0 = 0.61415, g1 = 48251.33, g2 = -67707.93, g3 = 10102100.0;
  const double Mw = 18.015268e-3;  /* kg/mol */
  double Q = rho * exp(a0 + a1 / T + a2 / (T * T) * pow(rho, 2.0 / 3.0));
  double pKG = g0 + g1 / T + g2 / (T * T) + g3 / (T * T * T);
  return -2 * n * (log10(1 + Q) - Q / (Q + 1) * rho * (b0 + b1 / T + b2 * rho)) + pKG +
         2 * log10(Mw);
}

double eqpi_water_pKw(double T)
{
  return eqpi_water_pKw_rho(T, eqpi_water_density(T));
}
