// Wasm loader: the page carries its WebAssembly module gzip-compressed and base64-encoded
// (assembled by web/assemble_page.py), so the single file stays small. It is inflated with the
// browser's DecompressionStream where there is one, and otherwise with the small inflater below
// (RFC 1951 DEFLATE, RFC 1952 gzip framing). Nothing is fetched.
(function () {
  function base64Bytes(text) {
    var bin = atob(text), out = new Uint8Array(bin.length);
    for (var i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
    return out;
  }

  // --- Inflater (RFC 1951): stored, fixed-Huffman and dynamic-Huffman blocks. ---
  function inflateRaw(src, start, sizeHint) {
    var out = new Uint8Array(sizeHint > 0 ? sizeHint : src.length * 4), outLen = 0;
    var pos = start, bitBuf = 0, bitCnt = 0;
    function need(n) {
      while (bitCnt < n) {
        if (pos >= src.length) throw new Error('truncated deflate data');
        bitBuf |= src[pos++] << bitCnt; bitCnt += 8;
      }
    }
    function bits(n) { need(n); var v = bitBuf & ((1 << n) - 1); bitBuf >>>= n; bitCnt -= n; return v; }
    function ensure(extra) {
      if (outLen + extra <= out.length) return;
      var bigger = new Uint8Array(Math.max(out.length * 2, outLen + extra));
      bigger.set(out.subarray(0, outLen)); out = bigger;
    }
    // A canonical Huffman table: counts per length and symbols in code order.
    function table(lengths, n) {
      var counts = new Uint16Array(16), offs = new Uint16Array(16), symbols = new Uint16Array(n);
      for (var i = 0; i < n; i++) counts[lengths[i]]++;
      counts[0] = 0;
      for (var l = 1; l < 16; l++) offs[l] = offs[l - 1] + counts[l - 1];
      for (var s = 0; s < n; s++) if (lengths[s]) symbols[offs[lengths[s]]++] = s;
      return { counts: counts, symbols: symbols };
    }
    function decode(t) {
      var code = 0, first = 0, index = 0;
      for (var len = 1; len < 16; len++) {
        code |= bits(1);
        var count = t.counts[len];
        if (code - count < first) return t.symbols[index + (code - first)];
        index += count; first += count; first <<= 1; code <<= 1;
      }
      throw new Error('bad Huffman code');
    }
    var LBASE = [3,4,5,6,7,8,9,10,11,13,15,17,19,23,27,31,35,43,51,59,67,83,99,115,131,163,195,227,258];
    var LEXTRA = [0,0,0,0,0,0,0,0,1,1,1,1,2,2,2,2,3,3,3,3,4,4,4,4,5,5,5,5,0];
    var DBASE = [1,2,3,4,5,7,9,13,17,25,33,49,65,97,129,193,257,385,513,769,1025,1537,2049,3073,4097,6145,8193,12289,16385,24577];
    var DEXTRA = [0,0,0,0,1,1,2,2,3,3,4,4,5,5,6,6,7,7,8,8,9,9,10,10,11,11,12,12,13,13];
    var ORDER = [16,17,18,0,8,7,9,6,10,5,11,4,12,3,13,2,14,1,15];
    var fixedLit = null, fixedDist = null;
    var last = 0;
    while (!last) {
      last = bits(1);
      var type = bits(2);
      if (type === 0) {
        bitBuf = 0; bitCnt = 0;
        var len = src[pos] | (src[pos + 1] << 8); pos += 4;
        ensure(len); out.set(src.subarray(pos, pos + len), outLen); outLen += len; pos += len;
        continue;
      }
      var lit, dist;
      if (type === 1) {
        if (!fixedLit) {
          var l = new Uint8Array(288);
          for (var i = 0; i < 144; i++) l[i] = 8; for (; i < 256; i++) l[i] = 9; for (; i < 280; i++) l[i] = 7; for (; i < 288; i++) l[i] = 8;
          fixedLit = table(l, 288);
          var d = new Uint8Array(30); for (i = 0; i < 30; i++) d[i] = 5;
          fixedDist = table(d, 30);
        }
        lit = fixedLit; dist = fixedDist;
      } else if (type === 2) {
        var hlit = bits(5) + 257, hdist = bits(5) + 1, hclen = bits(4) + 4;
        var cl = new Uint8Array(19);
        for (i = 0; i < hclen; i++) cl[ORDER[i]] = bits(3);
        var clTable = table(cl, 19), lens = new Uint8Array(hlit + hdist);
        for (i = 0; i < hlit + hdist;) {
          var sym = decode(clTable);
          if (sym < 16) lens[i++] = sym;
          else {
            var rep = 0, val = 0;
            if (sym === 16) { if (i === 0) throw new Error('bad repeat'); val = lens[i - 1]; rep = 3 + bits(2); }
            else if (sym === 17) rep = 3 + bits(3);
            else rep = 11 + bits(7);
            while (rep--) lens[i++] = val;
          }
        }
        lit = table(lens.subarray(0, hlit), hlit); dist = table(lens.subarray(hlit), hdist);
      } else throw new Error('bad block type');
      for (;;) {
        var s = decode(lit);
        if (s < 256) { ensure(1); out[outLen++] = s; }
        else if (s === 256) break;
        else {
          s -= 257;
          var length = LBASE[s] + bits(LEXTRA[s]);
          var ds = decode(dist), back = DBASE[ds] + bits(DEXTRA[ds]);
          ensure(length);
          for (var k = 0; k < length; k++) { out[outLen] = out[outLen - back]; outLen++; }
        }
      }
    }
    return out.subarray(0, outLen);
  }

  function gunzip(bytes) {
    if (bytes[0] !== 0x1f || bytes[1] !== 0x8b || bytes[2] !== 8) throw new Error('not gzip data');
    var flags = bytes[3], p = 10;
    if (flags & 4) p += 2 + (bytes[p] | (bytes[p + 1] << 8));
    if (flags & 8) { while (bytes[p++]); }
    if (flags & 16) { while (bytes[p++]); }
    if (flags & 2) p += 2;
    var n = bytes.length, size = (bytes[n - 4] | (bytes[n - 3] << 8) | (bytes[n - 2] << 16) | (bytes[n - 1] << 24)) >>> 0;
    return inflateRaw(bytes, p, size);
  }

  function inflateGzip(bytes) {
    if (typeof DecompressionStream === 'function' && typeof Response === 'function') {
      try {
        var stream = new Blob([bytes]).stream().pipeThrough(new DecompressionStream('gzip'));
        return new Response(stream).arrayBuffer().then(function (b) { return new Uint8Array(b); },
                                                       function () { return gunzip(bytes); });
      } catch (e) { /* fall through to the inflater */ }
    }
    return Promise.resolve().then(function () { return gunzip(bytes); });
  }

  globalThis.tallyproofWasm = {
    gunzip: gunzip,
    // Emscripten's Module.instantiateWasm hook: inflate the embedded module and instantiate it.
    instantiate: function (imports, done) {
      var el = document.getElementById('tp-wasm');
      inflateGzip(base64Bytes(el.textContent.trim()))
        .then(function (bytes) { return WebAssembly.instantiate(bytes, imports); })
        .then(function (r) { el.textContent = ''; done(r.instance, r.module); })
        .catch(function (e) {
          var s = document.getElementById('tp-start');
          if (s) s.textContent = 'This browser could not start the calculator: ' + e.message;
        });
      return {};
    }
  };
})();
