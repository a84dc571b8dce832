/* json_check: read a JSON document on stdin, check it parses, with nothing
** before or after it, and is valid UTF-8 (RFC 8259, section 8.1); print the
** values at the dotted paths given as arguments ("results.0.pH"), one per
** line. Exit 1 if the document or a path is missing.
** json_check --lines [TYPE]: read JSON Lines; every line ending in a newline
** must be a valid document (a last line without one is reported). Prints the
** number of records, or of records whose "type" is TYPE. */
/* SPDX-License-Identifier: MIT */
#include <cjson/cJSON.h>
#include <ctype.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Offset of the first invalid UTF-8 byte, or -1 if there is none. */
static long bad_utf8(const unsigned char *s, size_t n)
{
  for (size_t i = 0; i < n;) {
    unsigned c = s[i];
    size_t len = c < 0x80 ? 1 : c >= 0xC2 && c <= 0xDF ? 2 : c >= 0xE0 && c <= 0xEF ? 3
               : c >= 0xF0 && c <= 0xF4 ? 4 : 0;
    if (!len || i + len > n) return (long)i;
    unsigned lo = c == 0xE0 ? 0xA0 : c == 0xF0 ? 0x90 : 0x80;
    unsigned hi = c == 0xED ? 0x9F : c == 0xF4 ? 0x8F : 0xBF;
    for (size_t k = 1; k < len; k++)
      if (s[i + k] < (k == 1 ? lo : 0x80) || s[i + k] > (k == 1 ? hi : 0xBF)) return (long)i;
    i += len;
  }
  return -1;
}

static int check_lines(char *buf, size_t n, const char *type)
{
  long count = 0, line = 0;
  char *p = buf, *end = buf + n;
  while (p < end) {
    char *nl = memchr(p, '\n', (size_t)(end - p));
    line++;
    if (!nl) {
      fprintf(stderr, "json_check: line %ld has no newline (a cut record)\n", line);
      return 1;
    }
    *nl = '\0';
    long bad = bad_utf8((const unsigned char *)p, (size_t)(nl - p));
    cJSON *o = bad < 0 ? cJSON_ParseWithOpts(p, NULL, 1) : NULL;
    if (!o) {
      fprintf(stderr, "json_check: line %ld is not valid %s: %.60s\n", line,
              bad < 0 ? "JSON" : "UTF-8", p);
      return 1;
    }
    cJSON *t = cJSON_GetObjectItemCaseSensitive(o, "type");
    if (!type || (cJSON_IsString(t) && strcmp(t->valuestring, type) == 0)) count++;
    cJSON_Delete(o);
    p = nl + 1;
  }
  printf("%ld\n", count);
  return 0;
}

int main(int argc, char **argv)
{
  /* all of stdin, however large (a document of 20,000 results is 23 MB) */
  size_t n = 0, cap = 1 << 20, got;
  char *buf = malloc(cap);
  while (buf && (got = fread(buf + n, 1, cap - n - 1, stdin)) > 0) {
    n += got;
    if (cap - n - 1 == 0) {
      char *more = realloc(buf, cap * 2);
      if (!more) break;
      buf = more;
      cap *= 2;
    }
  }
  if (!buf) return 1;
  buf[n] = '\0';
  if (argc > 1 && strcmp(argv[1], "--lines") == 0) {
    int lrc = check_lines(buf, n, argv[2]);
    free(buf);
    return lrc;
  }
  long bad = bad_utf8((const unsigned char *)buf, n);
  if (bad >= 0) {
    fprintf(stderr, "json_check: invalid UTF-8 at byte %ld\n", bad);
    free(buf);
    return 1;
  }
  /* one document and nothing after it */
  cJSON *doc = cJSON_ParseWithOpts(buf, NULL, 1);
  if (!doc) {
    fprintf(stderr, "json_check: not one valid JSON document near: %.40s\n",
            cJSON_GetErrorPtr());
    free(buf);
    return 1;
  }
  free(buf);
  int rc = 0;
  for (int a = 1; a < argc; a++) {
    char path[512];
    snprintf(path, sizeof path, "%s", argv[a]);
    cJSON *v = doc;
    for (char *k = strtok(path, "."); k && v; k = strtok(NULL, "."))
      v = isdigit((unsigned char)k[0]) ? cJSON_GetArrayItem(v, atoi(k))
                                       : cJSON_GetObjectItemCaseSensitive(v, k);
    if (!v) {
      fprintf(stderr, "json_check: no '%s'\n", argv[a]);
      rc = 1;
      continue;
    }
    if (cJSON_IsNumber(v)) printf("%.17g\n", v->valuedouble);
    else if (cJSON_IsString(v)) printf("%s\n", v->valuestring);
    else if (cJSON_IsArray(v)) printf("%d\n", cJSON_GetArraySize(v));
    else printf("%s\n", cJSON_IsNull(v) ? "null" : cJSON_IsTrue(v) ? "true" : "false");
  }
  cJSON_Delete(doc);
  return rc;
}
