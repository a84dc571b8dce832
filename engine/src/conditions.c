/* Which reactions form a complex of a metal ion: those whose published
** constant depends on the medium, and so should say the ionic strength
** and temperature it was measured at (species check warns otherwise). */
/* SPDX-License-Identifier: MIT */
#include "eqp_impl.h"

/* Elements that are not metals for this purpose: H, B, C, N, O, F, Si, P,
** S, Cl, As, Se, Br, I and the noble gases (atomic numbers). */
static int nonmetal(int z)
{
  static const unsigned char nm[] = {1, 2, 5, 6, 7, 8, 9, 10, 14, 15, 16, 17, 18,
                                     33, 34, 35, 36, 53, 54, 86};
  for (size_t i = 0; i < sizeof nm; i++)
    if (nm[i] == z) return 1;
  return 0;
}

static int metal_ion(const eqpi_species *s)
{
  if (!(s->comp.charge > 0)) return 0;
  for (int i = 0; i < s->comp.n; i++)
    if (!nonmetal(s->comp.el[i])) return 1;
  return 0;
}

int eqpi_reaction_metal_ligand(const eqpi_db *db, const eqpi_reaction *r)
{
  int metal = 0, ligand = 0;
  for (int i = 0; i < r->n; i++) {
    int k = r->reactant[i];
    if (k < 0 || k >= db->nsp || r->nu[i] == 0) continue;
    if (r->nu[i] > 0 && metal_ion(&db->sp[k])) metal = 1;
    else if (k != db->h_plus) ligand = 1;   /* water too: a hydroxo complex */
  }
  return metal && ligand;
}
