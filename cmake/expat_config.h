/* expat's build settings for Tallyproof (its own expat_config.h.cmake, filled in by hand for the
   two targets we build: Debian 12 x86-64 with glibc, and Emscripten's wasm32). Both are
   little-endian with the C99 headers. Entropy for the hash salt (against hash flooding): getrandom
   natively (glibc 2.36); Emscripten 3.1.6's libc has no getrandom, so the page takes expat's
   fallback (XML_POOR_ENTROPY: time and address bits), enough for files the user opens herself. */
#ifndef EXPAT_CONFIG_H
#define EXPAT_CONFIG_H 1
#define BYTEORDER 1234
#ifdef __EMSCRIPTEN__
#define XML_POOR_ENTROPY 1
#else
#define HAVE_GETRANDOM 1
#endif
#define HAVE_INTTYPES_H 1
#define HAVE_STDINT_H 1
#define HAVE_STDLIB_H 1
#define HAVE_STRING_H 1
#define HAVE_SYS_TYPES_H 1
#define HAVE_UNISTD_H 1
#define STDC_HEADERS 1
#define PACKAGE "expat"
#define PACKAGE_NAME "expat"
#define PACKAGE_VERSION "2.5.0"
#define XML_CONTEXT_BYTES 1024
#define XML_DTD 1
#define XML_NS 1
#endif
