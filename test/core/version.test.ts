import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { SOFTWARE_VERSION } from '../../src/core/version';

describe('SOFTWARE_VERSION', () => {
  it('equals the version in package.json (the one npm and exports report)', () => {
    const pkg = JSON.parse(readFileSync(join(__dirname, '..', '..', 'package.json'), 'utf8')) as { version: string };
    expect(SOFTWARE_VERSION).toBe(pkg.version);
  });
});
