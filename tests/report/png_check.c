/* Checks a screenshot: a PNG of at least the given size that is not blank
** and shows the plots' ink (the palette's deep blue, #035283, within a
** small tolerance for antialiasing). Prints what it found.
** Usage: png_check FILE.png MIN_WIDTH MIN_HEIGHT */
/* SPDX-License-Identifier: MIT */
#include <png.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int main(int argc, char **argv)
{
  if (argc != 4) {
    fprintf(stderr, "usage: png_check FILE.png MIN_WIDTH MIN_HEIGHT\n");
    return 2;
  }
  png_image img;
  memset(&img, 0, sizeof img);
  img.version = PNG_IMAGE_VERSION;
  if (!png_image_begin_read_from_file(&img, argv[1])) {
    fprintf(stderr, "png_check: %s: %s\n", argv[1], img.message);
    return 1;
  }
  img.format = PNG_FORMAT_RGB;
  size_t size = PNG_IMAGE_SIZE(img);
  unsigned char *px = malloc(size);
  if (!px || !png_image_finish_read(&img, NULL, px, 0, NULL)) {
    fprintf(stderr, "png_check: cannot decode %s\n", argv[1]);
    return 1;
  }
  size_t n = (size_t)img.width * img.height, ink = 0, blue = 0;
  for (size_t i = 0; i < n; i++) {
    const unsigned char *p = px + 3 * i;
    if (p[0] < 240 || p[1] < 240 || p[2] < 240) ink++;
    if (abs(p[0] - 0x03) < 24 && abs(p[1] - 0x52) < 24 && abs(p[2] - 0x83) < 24) blue++;
  }
  free(px);
  printf("%s: %ux%u, %.1f %% of pixels not white, %zu pixels of the first palette colour\n",
         argv[1], img.width, img.height, 100.0 * (double)ink / (double)n, blue);
  if (img.width < (unsigned)atoi(argv[2]) || img.height < (unsigned)atoi(argv[3])) return 1;
  return ink > n / 50 && blue > 200 ? 0 : 1;   /* over 2 % ink, and a drawn curve */
}
