#!/usr/bin/python3
"""Assembles dist/tallyproof.html, one self-contained file: the page template (web/shell.html)
with the wasm loader, the WebAssembly module gzip-compressed and base64-encoded, and
Emscripten's JavaScript, all inline. Nothing in the result refers to any other file or URL.
The form view's action numbers come from web/form_actions.def (the same list the C++ reads).
Usage: assemble_page.py SHELL_HTML LOADER_JS EMSCRIPTEN_JS WASM OUTPUT_HTML FORM_ACTIONS_DEF"""
import base64
import gzip
import json
import re
import sys


def form_actions(path):
    """{name: number} from the TP_FORM_ACTION(name, number) lines of form_actions.def."""
    actions = {}
    for m in re.finditer(r"^TP_FORM_ACTION\((\w+),\s*(\d+)\)", open(path, encoding="utf-8").read(), re.M):
        actions[m.group(1)] = int(m.group(2))
    if not actions or len(set(actions.values())) != len(actions):
        sys.exit(f"assemble_page: {path} has no actions, or two with one number")
    return actions


def main():
    shell_path, loader_path, js_path, wasm_path, out_path, actions_path = sys.argv[1:7]
    shell = open(shell_path, encoding="utf-8").read()
    loader = open(loader_path, encoding="utf-8").read()
    js = open(js_path, encoding="utf-8").read()
    wasm = open(wasm_path, "rb").read()
    packed = base64.b64encode(gzip.compress(wasm, compresslevel=9, mtime=0)).decode("ascii")
    for name, text in (("loader", loader), ("emscripten", js)):
        if "</script" in text.lower():
            sys.exit(f"assemble_page: the {name} script contains </script and cannot be inlined")
    if re.search(r"https?://", js) and "sourceMappingURL" in js:
        sys.exit("assemble_page: the Emscripten script refers to a source map URL")
    blocks = (f'<script>\n{loader}\n</script>\n'
              f'<script type="application/octet-stream" id="tp-wasm">{packed}</script>\n'
              f'<script>\n{js}\n</script>')
    if "{{{ SCRIPT }}}" not in shell:
        sys.exit("assemble_page: the template has no {{{ SCRIPT }}} marker")
    if "{{{ FORM_ACTIONS }}}" not in shell:
        sys.exit("assemble_page: the template has no {{{ FORM_ACTIONS }}} marker")
    page = shell.replace("{{{ FORM_ACTIONS }}}", json.dumps(form_actions(actions_path), separators=(",", ":")))
    page = page.replace("{{{ SCRIPT }}}", blocks)
    with open(out_path, "w", encoding="utf-8") as f:
        f.write(page)
    print(f"assemble_page: {out_path}: {len(page)} bytes (wasm {len(wasm)} bytes, gzip+base64 {len(packed)})")


if __name__ == "__main__":
    main()
