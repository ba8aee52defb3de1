import Ajv, { type ErrorObject } from 'ajv';
import schema from '../../schemas/template-version.schema.json' with { type: 'json' };
import { TemplateContentSchema } from '../../shared/schemas/template';
import { badRequest, validationError } from '../middleware/errors';

const ajv = new Ajv({ allErrors: true, strict: false });
const validate = ajv.compile(schema);

export interface PointerIssue { pointer: string; message: string }

const describe = (e: ErrorObject): string => {
  if (e.keyword === 'required') return `is missing the required field "${(e.params as { missingProperty: string }).missingProperty}"`;
  if (e.keyword === 'enum') return `must be one of ${(e.params as { allowedValues: unknown[] }).allowedValues.map((v) => JSON.stringify(v)).join(', ')}`;
  if (e.keyword === 'const') return `must be ${JSON.stringify((e.params as { allowedValue: unknown }).allowedValue)}`;
  return e.message ?? 'is not valid';
};

/** Checks a template.json body against schemas/template-version.schema.json; 400 listing JSON pointers (RFC 6901). */
export function parseTemplateFile(body: unknown) {
  if (!validate(body)) {
    const issues: PointerIssue[] = (validate.errors ?? [])
      .filter((e) => e.keyword !== 'if' && e.keyword !== 'oneOf')
      .slice(0, 50)
      .map((e) => ({ pointer: e.instancePath || '/', message: `${e.instancePath || 'the file'} ${describe(e)}` }));
    const first = issues[0];
    throw badRequest(`The template file does not match schemas/template-version.schema.json: ${first ? first.message : 'unknown problem'}${issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''}.`, { issues }, 'invalid-template-file');
  }
  const parsed = TemplateContentSchema.safeParse(body);
  if (!parsed.success) throw validationError(parsed.error, 'template file');
  return parsed.data;
}
