/* Equipoise version numbers: those of the headers a program was built
** with. eqp_version() gives those of the library that runs. */
/* SPDX-License-Identifier: MIT */
#ifndef EQUIPOISE_VERSION_H
#define EQUIPOISE_VERSION_H

#define EQP_VERSION_MAJOR 0
#define EQP_VERSION_MINOR 1
#define EQP_VERSION_PATCH 0
#define EQP_VERSION_STRING "0.1.0"
/* One number that orders versions: 10000 * major + 100 * minor + patch. */
#define EQP_VERSION_NUMBER \
  (EQP_VERSION_MAJOR * 10000 + EQP_VERSION_MINOR * 100 + EQP_VERSION_PATCH)

#endif
