import type { NamingConvention } from '../schemas/naming';
import type { TemplateContent } from '../schemas/template';
import { DRAWING_LAYERS, componentLayer } from '../interchange/drawing-layers';
import { checkName } from './check-name';

export interface VersionNamingProblem {
  /** Stable across versions, so a comparison can say which problems a change introduced or resolved. */
  key: string;
  target: 'component' | 'layer';
  name: string;
  message: string;
}

/** Every name a version puts into the world — component codes and every layer of its drawing — checked against the convention. */
export function versionNamingProblems(content: Pick<TemplateContent, 'components'>, convention: NamingConvention): VersionNamingProblem[] {
  const out: VersionNamingProblem[] = [];
  const seen = new Set<string>();
  const check = (target: 'component' | 'layer', name: string) => {
    if (seen.has(`${target}:${name}`)) return;
    seen.add(`${target}:${name}`);
    for (const p of checkName(convention[target], name, target).problems) {
      out.push({ key: `${target}:${name}:${p.token ?? ''}:${p.message}`, target, name, message: `${target === 'layer' ? 'Layer' : 'Component code'} ${name}: ${p.message}` });
    }
  };
  for (const c of content.components) {
    check('component', c.code);
    check('layer', componentLayer(c));
  }
  for (const layer of Object.values(DRAWING_LAYERS)) check('layer', layer);
  return out;
}
