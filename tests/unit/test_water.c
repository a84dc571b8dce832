/* Water properties against published tables. */
/* SPDX-License-Identifier: MIT */
#include "eqp_test.h"
#include "eqp_impl.h"

/* Density of air-free water at 101.325 kPa, g/cm3, CRC Handbook table
** "Properties of water in the range 0-100 C" [from memory].
** Tolerance 1e-5: the shift between
** Kell's IPTS-68 temperatures and the ITS-90 ones of later tables (about
** 2e-6 g/cm3 near 25 C). */
static void test_density_kell_table(void **state)
{
  assert_close(eqpi_water_density(273.15), 0.999840, 1e-5);
  assert_close(eqpi_water_density(277.15), 0.999972, 1e-5);
  assert_close(eqpi_water_density(298.15), 0.997047, 1e-5);
  assert_close(eqpi_water_density(310.15), 0.993336, 1e-5);
  assert_close(eqpi_water_density(323.15), 0.988037, 1e-5);
  assert_close(eqpi_water_density(373.15), 0.958365, 1e-5);
}

/* Relative permittivity: C. G. Malmberg, A. A. Maryott, J. Res. NBS 56, 1
** (1956), Table 3 [from memory]: 87.74 (0 C), 78.30 (25 C), 69.91 (50 C),
** 55.72 (100 C). */
static void test_permittivity_table(void **state)
{
  assert_close(eqpi_water_permittivity(273.15), 87.74, 0.01);
  assert_close(eqpi_water_permittivity(298.15), 78.30, 0.01);
  assert_close(eqpi_water_permittivity(323.15), 69.91, 0.01);
  assert_close(eqpi_water_permittivity(373.15), 55.72, 0.01);
}

/* Debye-Hueckel constants at 25 C, molal scale: A = 0.5108 and
** B = 0.3287 per Angstrom (R. G. Bates, Determination of pH, 2nd ed.,
** Wiley 1973, Table of A and B [from memory]; older texts give 0.509 to
** 0.5115 for A). */
static void test_debye_huckel_25C(void **state)
{
  double A, B;
  eqpi_debye_huckel_AB(298.15, &A, &B);
  assert_close(A, 0.5108, 0.0005);
  assert_close(B, 0.3287, 0.0005);
}

int main(void)
{
  const struct CMUnitTest tests[] = {
    cmocka_unit_test(test_density_kell_table),
    cmocka_unit_test(test_permittivity_table),
    cmocka_unit_test(test_debye_huckel_25C),
  };
  return cmocka_run_group_tests(tests, NULL, NULL);
}
