/* json_check: read a JSON document on stdin, check it parses, and print the
** values at the dotted paths given as arguments ("results.0.pH"), one per
** line. Exit 1 if the document or a path is missing. */
/* SPDX-License-Identifier: MIT */
#include <cjson/cJSON.h>
#include <ctype.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

int main(int argc, char **argv)
{
  static char buf[1 << 22];
  size_t n = fread(buf, 1, sizeof buf - 1, stdin);
  buf[n] = '\0';
  cJSON *doc = cJSON_Parse(buf);
  if (!doc) {
    fprintf(stderr, "json_check: not valid JSON near: %.40s\n", cJSON_GetErrorPtr());
    return 1;
  }
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
