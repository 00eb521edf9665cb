import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { base64, crc32, encodePng } from '../../../app/figures/png.js';

describe('PNG encoder', () => {
  // ISO/IEC 15948 annex D; the CRC-32 check value of "123456789" is 0xCBF43926 (ISO 3309 / ITU-T V.42, from memory)
  it('CRC-32 gives the standard check value', () => {
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });

  it('base64 agrees with RFC 4648 test vectors', () => {
    const enc = (s: string) => base64(new TextEncoder().encode(s));
    expect(enc('')).toBe('');
    expect(enc('f')).toBe('Zg==');
    expect(enc('fo')).toBe('Zm8=');
    expect(enc('foo')).toBe('Zm9v');
    expect(enc('foobar')).toBe('Zm9vYmFy');
  });

  it('Pillow reads back the pixels and the 300 dpi resolution (pHYs)', () => {
    const w = 7;
    const h = 5;
    const rgba = new Uint8Array(w * h * 4);
    for (let i = 0; i < w * h; i++) rgba.set([(i * 37) % 256, (i * 11) % 256, 255 - ((i * 5) % 256), i % 3 === 0 ? 128 : 255], i * 4);
    const dir = mkdtempSync(join(tmpdir(), 'sw-png-'));
    try {
      const file = join(dir, 'x.png');
      writeFileSync(file, encodePng(rgba, w, h, 300));
      const py = spawnSync('/usr/bin/python3', ['-c', [
        'import sys, json',
        'from PIL import Image',
        'im = Image.open(sys.argv[1]); im.load()',
        'print(json.dumps({"size": im.size, "mode": im.mode, "dpi": [round(v, 3) for v in im.info["dpi"]], "px": list(im.tobytes())}))',
      ].join('\n'), file], { encoding: 'utf8' });
      expect(py.stderr).toBe('');
      const got = JSON.parse(py.stdout) as { size: number[]; mode: string; dpi: number[]; px: number[] };
      expect(got.size).toEqual([w, h]);
      expect(got.mode).toBe('RGBA');
      // 300 dpi is stored as round(300 / 0.0254) = 11811 pixels per metre, which reads back as 299.9994 dpi
      expect(got.dpi[0]).toBeCloseTo(300, 2);
      expect(got.px).toEqual([...rgba]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
