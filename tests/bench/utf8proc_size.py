#!/usr/bin/python3
"""What utf8proc (label normalisation, core/text/label_text.cpp) costs the single HTML file: compiles
its one C file for WebAssembly as the page does (emcc -Oz, without LTO so the object can be read),
prints the object's code and data (Unicode tables) section sizes, and what those bytes become in
the page (gzip -9 then base64, as web/assemble_page.py packs the module), beside the page's size.
Usage: utf8proc_size.py UTF8PROC_SOURCE_DIR PAGE_HTML"""
import base64
import gzip
import os
import subprocess
import sys
import tempfile


def leb(b, i):
    r = s = 0
    while True:
        x = b[i]
        i += 1
        r |= (x & 0x7F) << s
        s += 7
        if x < 0x80:
            return r, i


def sections(path):
    """Bytes of the code (10) and data (11) sections of a wasm module or object file."""
    b = open(path, "rb").read()
    out, i = {}, 8
    while i < len(b):
        sid = b[i]
        n, j = leb(b, i + 1)
        out[sid] = out.get(sid, b"") + b[j:j + n]
        i = j + n
    return out.get(10, b""), out.get(11, b"")


def packed(data):
    return len(base64.b64encode(gzip.compress(data, compresslevel=9, mtime=0)))


def main():
    src, page = sys.argv[1:3]
    env = dict(os.environ, NODE_PATH="/usr/share/nodejs")
    with tempfile.TemporaryDirectory() as tmp:
        obj = os.path.join(tmp, "utf8proc.o")
        subprocess.run(["emcc", "-Oz", "-DUTF8PROC_STATIC", "-c", os.path.join(src, "utf8proc.c"), "-o", obj],
                       check=True, env=env, capture_output=True)
        code, data = sections(obj)
    print(f"utf8proc {os.path.basename(os.path.realpath(src))} for wasm (emcc -Oz): code {len(code)} bytes, "
          f"data (Unicode tables) {len(data)} bytes")
    print(f"in the page (gzip -9, base64): code {packed(code)} bytes, data {packed(data)} bytes, "
          f"together {packed(code + data)} bytes")
    if os.path.exists(page):
        print(f"single file now: {os.path.getsize(page)} bytes (budget 1.5 MB = 1572864 bytes)")


if __name__ == "__main__":
    main()
