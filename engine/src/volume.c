/* How much volume a reagent takes: densities of the pure solids (and a few
** liquids) of the library, for the concentration-scale warning and for the
** water a recipe really needs. Volumes are taken as additive: a crystal's
** molar volume is larger than the apparent molar volume of the dissolved
** salt (electrostriction), so the estimate errs towards more volume and
** less water. */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"
#include <math.h>
#include <string.h>

const char eqpi_density_source[] =
  "D. R. Lide (ed.), CRC Handbook of Chemistry and Physics, 85th ed., CRC Press (2004), "
  "'Physical Constants of Inorganic Compounds' and '... of Organic Compounds', densities "
  "near 20-25 C [values from memory]";

/* g/cm3, by the formula the library gives the reagent. From memory as the
** source above says; "low" marks values of lower confidence. */
static const struct { const char *formula; double rho; } densities[] = {
  {"NaCl", 2.17},          {"KCl", 1.988},           {"NaNO3", 2.261},
  {"KNO3", 2.109},         {"NaOH", 2.13},           {"KOH", 2.044},
  {"CaCl2", 2.15},         {"CaCl2.2H2O", 1.85},     {"CaCl2.6H2O", 1.71},
  {"MgCl2", 2.325},        {"MgCl2.6H2O", 1.569},    {"CaCO3", 2.71},
  {"NaHCO3", 2.20},        {"Na2CO3", 2.54},         {"Na2CO3.10H2O", 1.46},
  {"KHCO3", 2.17},         {"NaH2PO4", 2.36},        {"NaH2PO4.H2O", 2.04},
  {"NaH2PO4.2H2O", 1.91},  {"Na2HPO4", 1.7},         {"Na2HPO4.2H2O", 2.066},
  {"Na2HPO4.7H2O", 1.68},  {"Na2HPO4.12H2O", 1.52},  {"Na3PO4", 2.536},
  {"Na3PO4.12H2O", 1.62},  {"KH2PO4", 2.338},        {"K2HPO4", 2.44},
  {"K3PO4", 2.564},        {"H3PO4", 1.834},         {"H3BO3", 1.435},
  {"BO3H3", 1.435},        {"Na2B4O7", 2.367},       {"Na2B4O7.10H2O", 1.73},
  {"HNO3", 1.5129},        /* liquid */
  {"CH3COONa", 1.528},     {"CH3COONa.3H2O", 1.45},  {"CH3COOK", 1.57},
  {"C2H5NO2", 1.607},      /* glycine */
  {"C6H8O7", 1.665},       {"C6H8O7.H2O", 1.542},    /* citric acid */
  {"KHC8H4O4", 1.636},     /* potassium hydrogen phthalate */
  {"C8H6O4", 1.593},       /* phthalic acid */
  {"C4H11NO3", 1.353},     /* Tris; low */
};

/* mL of one mol of liquid water at 25 C (Kell 1975 density) */
#define WATER_ML 18.069

int eqpi_reagent_volume(const eqpi_reagent *r, double *L)
{
  *L = 0;
  if (r->n == 1 && r->hydrate == 0 && r->formula && strcmp(r->formula, "H2O") == 0)
    return 1;                                   /* water itself is the solvent */
  double rho = r->density;                      /* a liquid of the library */
  for (size_t i = 0; isnan(rho) && i < sizeof densities / sizeof densities[0]; i++)
    if ((r->formula && strcmp(r->formula, densities[i].formula) == 0) ||
        strcmp(r->name, densities[i].formula) == 0)
      rho = densities[i].rho;
  if (!(rho > 0)) return 0;
  double mL = r->molar_mass / rho - r->hydrate * WATER_ML;
  *L = mL > 0 ? mL * 1e-3 : 0;
  return 1;
}
