/**
 * Names inside NetCDF-4 groups and the names CF attributes give from inside a group. CF 1.10 §2.7
 * (Groups): a reference is an absolute path, a path relative to the referring variable's group, or a
 * plain name searched in that group and then in each parent up to the root ("search by proximity").
 */
import { describe, expect, it } from 'vitest';
import { baseName, groupOf, missingVariableText, nameOfPath, referencedNames } from '../../../app/io/variable-path.js';

describe('names by group path', () => {
  it('root-group objects keep plain names; others carry their path', () => {
    expect(nameOfPath('/chl')).toBe('chl');
    expect(nameOfPath('/bgc/chl')).toBe('/bgc/chl');
    expect(nameOfPath('bgc/deep/o2')).toBe('/bgc/deep/o2');
    expect(groupOf('chl')).toBe('/');
    expect(groupOf('/bgc/deep/o2')).toBe('/bgc/deep');
    expect(baseName('/bgc/deep/o2')).toBe('o2');
  });

  it('resolves CF references as CF 1.10 §2.7 says: absolute, relative, then by proximity upward', () => {
    expect(referencedNames('/bgc/deep', '/lat')).toEqual(['lat']);
    expect(referencedNames('/bgc/deep', '../depth')).toEqual(['/bgc/depth']);
    expect(referencedNames('/bgc', 'deep/o2')).toEqual(['/bgc/deep/o2']);
    expect(referencedNames('/bgc/deep', 'lat')).toEqual(['/bgc/deep/lat', '/bgc/lat', 'lat']);
    expect(referencedNames('/', 'lat')).toEqual(['lat']);
  });

  it('an unknown group is named as such, an unknown variable in a known group as a variable', () => {
    const vars = [{ name: 'sst' }, { name: '/bgc/chl' }];
    expect(missingVariableText('/bgx/chl', vars, ['/', '/bgc'])).toBe("there is no group '/bgx' in this file (its groups: /bgc).");
    expect(missingVariableText('/bgc/o2', vars, ['/', '/bgc'])).toBe("there is no variable '/bgc/o2' (variables: sst, /bgc/chl).");
    expect(missingVariableText('/a/b', [{ name: 'x' }])).toBe("there is no group '/a' in this file (it has no groups).");
  });
});
