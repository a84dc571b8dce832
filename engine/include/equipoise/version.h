/* Equipoise version numbers. */
/* SPDX-License-Identifier: MIT */
#ifndef EQUIPOISE_VERSION_H
#define EQUIPOISE_VERSION_H

#define EQP_VERSION_MAJOR 0
#define EQP_VERSION_MINOR 1
#define EQP_VERSION_PATCH 0
#define EQP_VERSION_STRING "0.1.0"

#endif
