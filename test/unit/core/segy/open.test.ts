import { describe, expect, it } from 'vitest';
import { isInputFileError, type ProblemCode } from '../../../../core/problems';
import { memoryByteSource } from '../../../../core/segy/byte-source';
import { indexGathers, parseGatherKey, readGather } from '../../../../core/segy/gathers';
import { openSegy } from '../../../../core/segy/open';
import { fixture, fixtureBytes, fixtureValue } from './fixtures';

async function expectProblem(p: Promise<unknown>, code: ProblemCode): Promise<void> {
  try {
    await p;
  } catch (e) {
    expect(isInputFileError(e), String(e)).toBe(true);
    if (isInputFileError(e)) {
      expect(e.problem.code).toBe(code);
      expect(e.problem.file).toBeTruthy();
      expect(e.problem.found).not.toBeUndefined();
    }
    return;
  }
  throw new Error(`expected ${code}`);
}

describe('openSegy on the fixtures', () => {
  it.each([
    ['good.sgy', 'big', 'standard', 1, 5, 'ebcdic'],
    ['good-le.sgy', 'little', 'constant', 2, 5, 'ebcdic'],
    ['good-le-guess.sgy', 'little', 'guessed', 1, 5, 'ebcdic'],
    ['good-ibm.sgy', 'big', 'standard', 1, 1, 'ebcdic'],
    ['good-int16.sgy', 'big', 'standard', 1, 3, 'ebcdic'],
    ['good-int8.sgy', 'big', 'standard', 1, 8, 'ebcdic'],
    ['ascii-ext.sgy', 'big', 'standard', 1, 5, 'ascii'],
    ['rev0.sgy', 'big', 'standard', 0, 5, 'ebcdic'],
  ] as const)('%s reads with the right layout and exact samples', async (name, order, orderSource, revision, format, text) => {
    const f = await openSegy(fixture(name));
    expect([f.byteOrder, f.byteOrderSource, f.revision, f.formatCode, f.textEncoding]).toEqual([order, orderSource, revision, format, text]);
    expect([f.traceCount, f.nSamples, f.sampleIntervalUs]).toEqual([12, 50, 2000]);
    expect(f.warnings.map((w) => w.code)).toEqual(orderSource === 'guessed' ? ['segy.byte-order-guessed'] : []);
    expect(f.extendedTextHeaders.length).toBe(name === 'ascii-ext.sgy' ? 1 : 0);
    expect(f.textCards[1]).toContain('HARROWMERE');
    const idx = await indexGathers(f, parseGatherKey('record'));
    const g = await readGather(f, idx, 0);
    for (let i = 0; i < 12; i++)
      for (let s = 0; s < 50; s++) expect(g.data[i * 50 + s]).toBe(fixtureValue(i, 101, s));
    // Scalars applied: coordinate scalar −100 divides (SEG-Y rev 1 bytes 71–72; methods.md §6.8).
    expect(g.headers[3].receiverX).toBeCloseTo(1050 + 3 * 25, 9);
    expect(g.headers[3].fields.RECEIVER_X).toBe(105000 + 3 * 2500);
    expect(g.headers[3].offsetM).toBe(125);
  });

  it.each([
    ['truncated.sgy', 'segy.truncated'],
    ['wrong-count.sgy', 'segy.samples-per-trace'],
    ['contradictory-interval.sgy', 'segy.header-contradiction'],
    ['zero-traces.sgy', 'segy.zero-traces'],
    ['unknown-format.sgy', 'segy.format-code'],
    ['variable-length.sgy', 'segy.variable-length-traces'],
  ] as const)('%s gives %s', async (name, code) => {
    await expectProblem(openSegy(fixture(name)), code);
  });

  it('reads contradictory intervals leniently with a warning, trusting the binary header', async () => {
    const f = await openSegy(fixture('contradictory-interval.sgy'), { strict: false });
    expect(f.sampleIntervalUs).toBe(2000);
    expect(f.warnings.map((w) => w.code)).toContain('segy.header-contradiction');
  });

  it('names the trace and byte of a NaN sample', async () => {
    const f = await openSegy(fixture('nan-sample.sgy'));
    const idx = await indexGathers(f, parseGatherKey('record'));
    try {
      await readGather(f, idx, 0);
      throw new Error('no error');
    } catch (e) {
      expect(isInputFileError(e) && e.problem.code).toBe('segy.non-finite-sample');
      if (isInputFileError(e)) {
        expect(e.problem.traceIndex).toBe(3);
        expect(e.problem.byteOffset).toBe(3600 + 3 * 440 + 240 + 7 * 4);
      }
    }
  });

  it('refuses a file smaller than the headers, and a size that does not divide into traces', async () => {
    await expectProblem(openSegy(memoryByteSource('tiny', new Uint8Array(100))), 'segy.file-too-small');
    const good = fixtureBytes('good.sgy');
    // Change the first trace header's count too, so the layout is not self-consistent: a size mismatch.
    const b = good.slice(0, good.length - 100);
    new DataView(b.buffer).setUint16(3600 + 114, 49, false);
    await expectProblem(openSegy(memoryByteSource('cut', b)), 'segy.trace-size-mismatch');
    const lenient = await openSegy(memoryByteSource('cut', b), { strict: false });
    expect(lenient.traceCount).toBe(11);
  });

  it('refuses absurd or absent sample intervals', async () => {
    for (const [binDt, traceDt, code] of [[-5, 2000, 'segy.sample-interval'], [0, 0, 'segy.sample-interval'], [20000, -3, 'segy.sample-interval']] as const) {
      const b = fixtureBytes('good.sgy');
      const v = new DataView(b.buffer);
      v.setInt16(3216, binDt, false);
      for (let p = 3600; p < b.length; p += 440) v.setInt16(p + 116, traceDt, false);
      await expectProblem(openSegy(memoryByteSource('dt', b)), code);
    }
    const b = fixtureBytes('good.sgy');
    new DataView(b.buffer).setInt16(3216, 0, false); // binary header silent: the trace headers' interval is used
    expect((await openSegy(memoryByteSource('dt', b))).sampleIntervalUs).toBe(2000);
  });

  it('honours a forced byte order, and refuses one that makes the header absurd', async () => {
    const f = await openSegy(fixture('good-le-guess.sgy'), { byteOrder: 'little' });
    expect(f.byteOrderSource).toBe('option');
    await expectProblem(openSegy(fixture('good.sgy'), { byteOrder: 'little' }), 'segy.format-code');
  });

  it('reads a rev 2 file with the extended sample count and first-trace offset', async () => {
    const b = fixtureBytes('good-le.sgy');
    const v = new DataView(b.buffer);
    v.setUint16(3220, 0, true); // standard count cleared: rev 2 extended count 3269 holds it
    v.setInt32(3268, 50, true);
    const f = await openSegy(memoryByteSource('ext', b));
    expect(f.nSamples).toBe(50);
    expect(f.traceCount).toBe(12);
  });
});
