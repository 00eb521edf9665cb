/** One source of the recipe (the reference or a run): its variables with names and units (each file's "About"), its snapshots. */
import type { SourceInfo } from '../../contract/view-types.js';
import { typesetUnits } from '../../app/figures/typeset.js';
import { h } from '../elements.js';
import { showFileAbout } from './file-about.js';

export function sourceBlock(src: SourceInfo, kind: 'reference' | 'run'): HTMLElement {
  const vars = h('ul', { class: 'var-list' });
  for (const v of src.variables) {
    vars.append(
      h(
        'li',
        { title: `${v.name} in ${v.file}${v.longName ? '\n' + v.longName : ''}${v.units ? `\nunits in the file: ${v.units}` : ''}` },
        h('span', { class: 'var-key' }, v.key),
        h('span', { class: 'var-name' }, v.name),
        h('span', { class: `var-units${v.units === '?' ? ' bad' : ''}` }, v.units === '?' ? '?' : v.units ? typesetUnits(v.units) : 'no units'),
        aboutButton(v.file),
      ),
    );
  }
  const snaps = src.snapshots?.length ? h('p', { class: 'muted small' }, `${src.snapshots.length} spin-up snapshots, years ${src.snapshots[0].year ?? '?'}–${src.snapshots[src.snapshots.length - 1].year ?? '?'}`) : null;
  return h('section', { class: `source ${kind}` }, h('h3', {}, h('span', { class: 'source-kind' }, kind === 'reference' ? 'Reference' : 'Run'), src.label), vars, snaps);
}

function aboutButton(file: string): HTMLElement {
  const b = h('button', { type: 'button', class: 'about-file', title: `About ${file}`, 'aria-label': `About ${file}`, 'data-file': file }, 'i');
  b.addEventListener('click', () => showFileAbout(file));
  return b;
}
