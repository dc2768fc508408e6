/** Test helper: the SEG-Y fixtures of test/fixtures/segy/ (README.md there) as in-memory byte sources. */
import { readFileSync } from 'node:fs';
import { memoryByteSource, type ByteSource } from '../../../../core/segy/byte-source';

export const FIXTURE_DIR = new URL('../../../fixtures/segy/', import.meta.url).pathname;

export function fixtureBytes(name: string): Uint8Array {
  return new Uint8Array(readFileSync(FIXTURE_DIR + name));
}

export function fixture(name: string): ByteSource {
  return memoryByteSource(name, fixtureBytes(name));
}

/** The generator's sample value for trace i of record r, sample s (scripts/make-fixtures.ts). */
export function fixtureValue(i: number, record: number, s: number): number {
  return ((i + record + 1) * 37 + s * 11) % 201 - 100;
}
