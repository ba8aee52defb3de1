import type { NamingCheckResult, NamingRule, NamingTarget } from '../schemas/naming';
import { compileRule } from './compile-rule';

/**
 * Checks one layer name or component code against a rule. Layer names are held to the DXF R12
 * symbol-table limits as well, whatever the rule says. A rule that does not compile (one saved
 * through NamingConventionSchema always does) answers every name with its own problems rather
 * than throwing, so a bad rule shows up where names are checked instead of as a server error.
 */
export function checkName(rule: NamingRule, name: string, target: NamingTarget): NamingCheckResult {
  const compiled = compileRule(rule, target);
  if (!compiled.ok) {
    const which = target === 'layer' ? 'layer-name' : 'component-code';
    return {
      ok: false,
      problems: compiled.problems.map((p) => ({ token: null, message: `The ${which} rule cannot be used until it is fixed: ${p.message}` })),
    };
  }
  return compiled.checker.check(name, target);
}
