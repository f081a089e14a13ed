/**
 * A 3MF "zip bomb" (a small package whose model part inflates to hundreds of MB) is refused while inflating: the
 * reader stops after a few MB, and the analysis API answers 400 `bad_mesh` (reason too_large) instead of working
 * for half a minute. An ordinary package, and one written by an outside serializer, still read.
 * source: OWASP File Upload Cheat Sheet, OWASP Foundation, 2024 (limit the decompressed size of archives);
 * APPNOTE.TXT .ZIP File Format Specification 6.3.10, PKWARE, 2022 (local header, central directory layouts).
 */
import { createRequire } from 'node:module';
import { deflateRawSync } from 'node:zlib';
import { strToU8, zipSync } from 'fflate';
import { beforeAll, describe, expect, it } from 'vitest';
import { MeshFormatError } from '../shared/mesh/MeshFormatError';
import { parse3mf } from '../shared/mesh/parse3mf';
import { MAX_INFLATE_RATIO, unzipBounded } from '../shared/mesh/unzipBounded';
import { useTestApp } from './setup/testApp';

const MB = 1024 * 1024;
const MODEL_REL =
  '<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">' +
  '<Relationship Target="/3D/3dmodel.model" Id="rel0" Type="http://schemas.microsoft.com/3dmanufacturing/2013/01/3dmodel"/></Relationships>';

/** A raw deflate stream of `totalBytes` of repeated vertex XML (zlib packs it at about a thousand to one). */
function bombDeflate(totalBytes: number): Uint8Array {
  const unit = '<vertex x="0" y="0" z="0"/>';
  const block = Buffer.from(unit.repeat(Math.ceil(MB / unit.length)));
  const copies = Math.ceil(totalBytes / block.length);
  const whole = Buffer.allocUnsafe(block.length * copies);
  for (let i = 0; i < copies; i++) block.copy(whole, i * block.length);
  return deflateRawSync(whole, { level: 9 });
}

/** A ZIP package written by hand (so the declared sizes can be whatever a crafted file says). */
function zipByHand(entries: { name: string; data: Uint8Array; method: 0 | 8; declaredSize: number }[]): Uint8Array {
  const parts: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const entry of entries) {
    const name = Buffer.from(entry.name);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(entry.method, 8);
    local.writeUInt32LE(entry.data.length, 18);
    local.writeUInt32LE(entry.declaredSize, 22);
    local.writeUInt16LE(name.length, 26);
    const cd = Buffer.alloc(46);
    cd.writeUInt32LE(0x02014b50, 0);
    cd.writeUInt16LE(20, 4);
    cd.writeUInt16LE(20, 6);
    cd.writeUInt16LE(entry.method, 10);
    cd.writeUInt32LE(entry.data.length, 20);
    cd.writeUInt32LE(entry.declaredSize, 24);
    cd.writeUInt16LE(name.length, 28);
    cd.writeUInt32LE(offset, 42);
    parts.push(local, name, Buffer.from(entry.data));
    central.push(cd, name);
    offset += local.length + name.length + entry.data.length;
  }
  const cdBytes = Buffer.concat(central);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(cdBytes.length, 12);
  end.writeUInt32LE(offset, 16);
  return new Uint8Array(Buffer.concat([...parts, cdBytes, end]));
}

/** A package whose model part inflates to `inflatedBytes` and claims to be 1 KB. */
function makeBomb(inflatedBytes: number): Uint8Array {
  return zipByHand([
    { name: '_rels/.rels', data: strToU8(MODEL_REL), method: 0, declaredSize: MODEL_REL.length },
    { name: '3D/3dmodel.model', data: bombDeflate(inflatedBytes), method: 8, declaredSize: 1024 },
  ]);
}

let bomb: Uint8Array;
const t = useTestApp();
beforeAll(() => {
  bomb = makeBomb(300 * MB);
});

describe('3MF zip bomb', () => {
  it('is small on disk and would inflate to 300 MB', () => {
    expect(bomb.length).toBeLessThan(2 * MB);
    expect(bomb.length).toBeGreaterThan(1000);
  });

  it('is refused by the reader as too large while inflating, whatever size its header claims', () => {
    let partsOffered = 0;
    const err = (() => {
      try {
        unzipBounded(bomb, (name) => {
          partsOffered++;
          return name.endsWith('.model') || name.endsWith('.rels');
        });
      } catch (caught) {
        return caught;
      }
      return undefined;
    })();
    expect(err).toBeInstanceOf(MeshFormatError);
    expect((err as MeshFormatError).reason).toBe('too_large');
    expect((err as MeshFormatError).message).toMatch(/unpacks to over \d+ times/);
    expect(partsOffered).toBe(2);
    expect(() => parse3mf(bomb)).toThrow(MeshFormatError);
  });

  it('is refused by the total cap even when the ratio looks ordinary', () => {
    // 6 MB of varied digits compresses only a few times; a 4 MB cap refuses it.
    let text = '';
    for (let i = 0; text.length < 6 * MB; i++) text += `<vertex x="${(i * 7919) % 100003}" y="${i}" z="${i % 97}"/>`;
    const pkg = zipSync({ '_rels/.rels': strToU8(MODEL_REL), '3D/3dmodel.model': strToU8(text) });
    try {
      unzipBounded(pkg, () => true, { maxInflatedBytes: 4 * MB });
      expect.unreachable('the cap should refuse the package');
    } catch (err) {
      expect((err as MeshFormatError).reason).toBe('too_large');
      expect((err as MeshFormatError).message).toContain('unpacks to more than 4 MB');
    }
    expect(Object.keys(unzipBounded(pkg, () => true, { maxInflatedBytes: 8 * MB }))).toHaveLength(2);
  });

  it('leaves real packages alone: one from @jscad/3mf-serializer reads back', () => {
    const require = createRequire(import.meta.url);
    const { serialize } = require('@jscad/3mf-serializer') as {
      serialize: (options: object, ...objects: unknown[]) => ArrayBuffer[];
    };
    const { primitives } = require('@jscad/modeling') as {
      primitives: { sphere: (o: object) => unknown };
    };
    const sphere = primitives.sphere({ radius: 40, segments: 48 });
    const blobs = serialize({ unit: 'millimeter' }, sphere);
    const bytes = new Uint8Array(Buffer.concat(blobs.map((b) => Buffer.from(b))));
    const mesh = parse3mf(bytes);
    expect(mesh.indices.length / 3).toBeGreaterThan(1000);
    expect(MAX_INFLATE_RATIO).toBeGreaterThanOrEqual(50);
  });

  it('gets 400 bad_mesh from the analysis API', async () => {
    const designer = await t.agent('designer');
    const res = await designer.post('/api/analyses').attach('file', Buffer.from(bomb), 'bomb.3mf');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_mesh');
    expect(res.body.error.details.reason).toBe('too_large');
    expect(res.body.error.message).not.toMatch(/fflate|inflate|Error:/);
  });
});
