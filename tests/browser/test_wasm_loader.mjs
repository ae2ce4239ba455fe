// The page's fallback inflater (web/wasm_loader.js, used where the browser has no
// DecompressionStream) against Node's zlib, on the page's own embedded module and on
// generated data covering stored, fixed and dynamic Huffman blocks.
import { readFileSync } from 'node:fs';
import { gzipSync, gunzipSync, constants } from 'node:zlib';
import { createContext, runInContext } from 'node:vm';
import { randomBytes } from 'node:crypto';
import { assert } from './harness.mjs';

function loadInflater() {
  const context = createContext({ globalThis: {}, atob: (s) => Buffer.from(s, 'base64').toString('latin1'), Uint8Array, Uint16Array, Math, Error, Promise });
  context.globalThis = context;
  runInContext(readFileSync(new URL('../../web/wasm_loader.js', import.meta.url), 'utf8'), context);
  return context.tallyproofWasm.gunzip;
}

export const tests = {
  async 'fallback inflater matches zlib'() {
    const gunzip = loadInflater();
    const html = readFileSync(new URL('../../dist/tallyproof.html', import.meta.url), 'utf8');
    const m = html.match(/<script type="application\/octet-stream" id="tp-wasm">([A-Za-z0-9+/=]+)<\/script>/);
    assert(m, 'the page embeds no gzip module');
    const packed = Buffer.from(m[1], 'base64');
    const ours = Buffer.from(gunzip(new Uint8Array(packed)));
    const ref = gunzipSync(packed);
    assert(ours.equals(ref), `embedded module: ${ours.length} bytes vs zlib ${ref.length}`);
    assert(ref.subarray(0, 4).toString('latin1') === '\0asm', 'the module is WebAssembly');
    const samples = [Buffer.alloc(0), Buffer.from('a'), randomBytes(70000), Buffer.from('tally '.repeat(20000)),
      Buffer.concat([randomBytes(300), Buffer.alloc(5000, 7), randomBytes(300)])];
    for (const level of [0, 1, 9]) {
      for (const s of samples) {
        const z = gzipSync(s, { level, strategy: level === 1 ? constants.Z_FIXED : constants.Z_DEFAULT_STRATEGY });
        const out = Buffer.from(gunzip(new Uint8Array(z)));
        assert(out.equals(s), `level ${level}, ${s.length} bytes: mismatch`);
      }
    }
  },
};
