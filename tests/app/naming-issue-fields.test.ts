import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_CONVENTION } from '../../shared/naming/conventions';
import { fieldId, fieldPathOf, fieldWords, inWords, issuesByField } from '../../app/features/naming/issue-fields';
import { loadRulesJson, rulesDraft, rulesInput, editRules } from '../../app/features/naming/rule-draft';
import { makeTestApp, type Agent, type TestApp } from '../server/test-app';

/**
 * The naming form places the server's refusals on its own fields. The issues come from the real
 * server (PUT /api/naming/convention answered 400 with details.issues), not from a list written
 * here, so a change of paths on the server side shows up as a problem with no field.
 */

let t: TestApp;
let lead: Agent;
beforeAll(async () => { t = await makeTestApp(); lead = await t.agent('lead'); });
afterAll(async () => { await t.close(); });

const { version: _v, ...demo } = DEMO_CONVENTION;

describe('server issues on the form fields', () => {
  it('every issue of a many-fault save lands on a field the form draws, said without JSON names', async () => {
    const kind = demo.layer.tokens[0]!;
    const size = demo.layer.tokens[1]!;
    const bad = {
      layer: {
        ...demo.layer,
        patterns: [...demo.layer.patterns, 'FX-{kindd}'],
        tokens: [{ ...kind, values: ['CR', 'cr', ''] }, { ...size, min: 9, max: 2 }, ...demo.layer.tokens.slice(2)],
        maxLength: 40,
      },
      component: { ...demo.component, minLength: 50 },
    };
    const res = await lead.put('/api/naming/convention', bad);
    expect(res.status).toBe(400);
    const issues = res.body.error.details.issues as { path: string; message: string }[];
    const placed = issuesByField(issues);
    // The places a person would look: the pattern, each bad value, the number's bounds, the lengths.
    expect([...placed.keys()].sort()).toEqual([
      'component.maxLength', 'layer.maxLength', 'layer.patterns.7', 'layer.tokens.0.values.1', 'layer.tokens.0.values.2', 'layer.tokens.1.max',
    ].sort());
    // Each message is a sentence: a capital first, a full stop last, no dotted JSON path, no bare JSON key.
    for (const messages of placed.values()) for (const m of messages) {
      expect(m).toMatch(/^[A-Z].*[.?]$/);
      expect(m).not.toMatch(/\b(minLength|maxLength)\b|\w\.\d+\./);
    }
    const draft = rulesDraft(bad as never);
    expect(fieldWords('layer.tokens.0.values.1', draft)).toBe('Layer names, token kind, value 2');
    expect(fieldWords('layer.tokens.1.max', draft)).toBe('Layer names, token size, largest value');
    expect(fieldWords('component.maxLength', draft)).toBe('Component codes, longest length');
    expect(fieldId('layer.tokens.0.values.1')).toBe('naming-layer-tokens-0-values-1');
  });

  it('a problem inside no field goes to the nearest one that holds it', () => {
    expect(fieldPathOf('layer.tokens.3')).toBe('layer.tokens.3.name');
    expect(fieldPathOf('layer.tokens.3.values')).toBe('layer.tokens.3.values');
    expect(fieldPathOf('component')).toBe('component');
    expect(fieldPathOf('')).toBe('');
    expect(inWords('Token size has max 2 below min 9; no value could pass.')).toBe('Token size has the largest value 2 below the smallest value 9; no value could pass.');
  });
});

describe('the form saves what it shows', () => {
  it('the demo rules round-trip through the form unchanged, and the server takes them', async () => {
    const draft = rulesDraft(DEMO_CONVENTION);
    const input = JSON.parse(JSON.stringify(rulesInput(draft)));
    expect(input).toEqual(JSON.parse(JSON.stringify(demo)));
    const edited = editRules(draft, { type: 'value', target: 'layer', token: 0, index: 2, value: 'VX' });
    const saved = await lead.put('/api/naming/convention', rulesInput(edited)).expect(200);
    expect(saved.body.layer.tokens[0].values).toEqual(['CR', 'SR', 'VX']);
  });

  it('JSON a lead pastes is loaded when its shape is right, and refused in a sentence when not', () => {
    const loaded = loadRulesJson(JSON.stringify(DEMO_CONVENTION));
    expect(loaded.ok && JSON.parse(JSON.stringify(rulesInput(loaded.rules)))).toEqual(JSON.parse(JSON.stringify(demo)));
    const notJson = loadRulesJson('{"layer": ');
    expect(notJson.ok).toBe(false);
    expect(!notJson.ok && notJson.message).toMatch(/^The text is not JSON/);
    const badType = loadRulesJson(JSON.stringify({ ...demo, layer: { ...demo.layer, tokens: [{ name: 'x', type: 'date' }] } }));
    expect(!badType.ok && badType.message).toBe('Token 1 of the layer rule needs a "type" of "list", "number" or "regex".');
  });
});
