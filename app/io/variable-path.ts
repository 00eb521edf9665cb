/**
 * Names of variables and dimensions inside NetCDF-4 groups. A root-group object keeps its plain name
 * (`chl`); an object inside a group is named by its full path (`/bgc/chl`), so names never clash and a
 * person can write the path they see in the file. `/chl` and `bgc/chl` are accepted as spellings of the
 * same names. NetCDF names cannot contain '/', so a slash always separates groups.
 */
import type { RawVariable } from './types.js';

/** The name an object at this HDF5 path carries in a RawDataset. */
export function nameOfPath(path: string): string {
  const parts = path.split('/').filter(Boolean);
  return parts.length === 1 ? parts[0] : `/${parts.join('/')}`;
}

/** The group holding an object of this name: '/' for root-group names. */
export function groupOf(name: string): string {
  if (!name.startsWith('/')) return '/';
  const cut = name.lastIndexOf('/');
  return cut <= 0 ? '/' : name.slice(0, cut);
}

/** The last part of a name: what the object is called inside its group. */
export function baseName(name: string): string {
  return name.slice(name.lastIndexOf('/') + 1);
}

/**
 * The variable a CF attribute (`coordinates`, `bounds`, `climatology`) names from a variable in group
 * `from`: an absolute path as it stands, a relative path from that group, a plain name searched in that
 * group and then its parents up to the root (CF 1.10 §2.7 "search by proximity").
 */
export function referencedNames(from: string, ref: string): string[] {
  if (ref.startsWith('/')) return [nameOfPath(ref)];
  if (ref.includes('/')) {
    const parts = from.split('/').filter(Boolean);
    for (const p of ref.split('/').filter(Boolean)) {
      if (p === '..') parts.pop();
      else if (p !== '.') parts.push(p);
    }
    return [nameOfPath(`/${parts.join('/')}`)];
  }
  const out: string[] = [];
  const parts = from.split('/').filter(Boolean);
  for (let n = parts.length; n >= 0; n--) out.push(nameOfPath(`/${[...parts.slice(0, n), ref].join('/')}`));
  return out;
}

/**
 * Why a name finds no variable, for "<file>, variable '<name>': ..." sentences: the group of a path
 * that names a group the file lacks, else the variable itself.
 */
export function missingVariableText(name: string, variables: readonly { name: string }[], groups: readonly string[] = ['/']): string {
  const wanted = nameOfPath(name);
  const group = groupOf(wanted);
  if (group !== '/' && !groups.includes(group)) {
    const others = groups.filter((g) => g !== '/');
    return `there is no group '${group}' in this file (${others.length ? `its groups: ${others.join(', ')}` : 'it has no groups'}).`;
  }
  const names = variables.map((x) => x.name).join(', ');
  return `there is no variable '${name}' (variables: ${names || 'none'}).`;
}

/** The variable that an attribute of `from` names (see referencedNames), or undefined. */
export function findReferenced(variables: readonly RawVariable[], from: RawVariable, ref: string): RawVariable | undefined {
  for (const name of referencedNames(groupOf(from.name), ref.trim())) {
    const v = variables.find((x) => x.name === name);
    if (v) return v;
  }
  return undefined;
}
