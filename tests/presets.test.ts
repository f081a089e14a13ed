/**
 * `/api/presets`: create, read, list, rename, change parameters, delete; owner-only visibility; parameter checks by the
 * template's own parseParams; unique names per template per owner; thumbnail data-URL checks.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { useTestApp, type TestAgent } from './setup/testApp';
import { TEMPLATES, describeParameters } from '../templates/index';
import { PRESET_THUMBNAIL_MAX_CHARS, PresetSchema } from '../shared/schemas/preset';

// A real 1×1 PNG (8-bit RGBA), base64: the smallest thumbnail the API must accept.
const PNG_1PX =
  'data:image/png;base64,iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==';

const template = TEMPLATES[0];
const described = template ? describeParameters(template) : [];
/** The entry-hole parameter when the template has one, else its first number parameter. */
const sizeParam =
  described.find((param) => param.key === 'entryHoleDiameterMm') ?? described.find((param) => param.kind === 'number');

const t = useTestApp();
let designer: TestAgent;
let otherDesigner: TestAgent;

beforeAll(async () => {
  designer = await t.agent('designer');
  const admin = await t.agent('admin');
  const created = await admin.post('/api/people').send({
    name: 'Wren Alder',
    email: 'wren@fernhollow.test',
    roles: ['designer'],
    password: 'second-designer-pw',
  });
  expect(created.status).toBe(201);
  otherDesigner = await t.signIn('wren@fernhollow.test', 'second-designer-pw');
});

describe('presets API', () => {
  it('has a registered template with a numeric parameter to work with', () => {
    expect(template).toBeDefined();
    expect(sizeParam?.min).toBeTypeOf('number');
    expect(sizeParam?.max).toBeTypeOf('number');
  });

  it('creates a preset with complete, checked parameters and a thumbnail, then reads, lists, renames and deletes it', async () => {
    const key = sizeParam!.key;
    const value = sizeParam!.min! + (sizeParam!.max! - sizeParam!.min!) / 4;
    const created = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: '  Small entry  ', params: { [key]: value }, thumbnail: PNG_1PX });
    expect(created.status).toBe(201);
    const preset = PresetSchema.parse(created.body);
    expect(preset.name).toBe('Small entry'); // trimmed
    expect(preset.templateVersion).toBe(template.version);
    expect(preset.thumbnail).toBe(PNG_1PX);
    expect(preset.params[key]).toBeCloseTo(value, 9);
    // Every other parameter took the template's default (parseParams merges them).
    for (const param of described) expect(preset.params).toHaveProperty(param.key);

    const read = await designer.get(`/api/presets/${preset.id}`);
    expect(read.status).toBe(200);
    expect(read.body.params[key]).toBeCloseTo(value, 9);

    const listed = await designer.get('/api/presets').query({ templateId: template.id });
    expect(listed.status).toBe(200);
    expect(listed.body.presets.map((p: { id: string }) => p.id)).toContain(preset.id);
    const otherTemplate = await designer.get('/api/presets').query({ templateId: 'no-such-template' });
    expect(otherTemplate.body.presets).toEqual([]);

    const renamed = await designer.patch(`/api/presets/${preset.id}`).send({ name: 'Small entry, v2' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.name).toBe('Small entry, v2');
    expect(renamed.body.params[key]).toBeCloseTo(value, 9);
    expect(Date.parse(renamed.body.updatedAt)).toBeGreaterThanOrEqual(Date.parse(preset.updatedAt));

    // three quarters up the range: the top of the entry range (65 mm) no longer fits under the default roof, which
    // parseParams rejects by name (templatesDefaults.test.ts)
    const movedValue = sizeParam!.min! + ((sizeParam!.max! - sizeParam!.min!) * 3) / 4;
    const moved = await designer.patch(`/api/presets/${preset.id}`).send({ params: { [key]: movedValue } });
    expect(moved.status).toBe(200);
    expect(moved.body.params[key]).toBeCloseTo(movedValue, 9);

    const cleared = await designer.patch(`/api/presets/${preset.id}`).send({ thumbnail: null });
    expect(cleared.body.thumbnail).toBeNull();

    const deleted = await designer.delete(`/api/presets/${preset.id}`);
    expect(deleted.status).toBe(204);
    expect((await designer.get(`/api/presets/${preset.id}`)).status).toBe(404);
    expect((await designer.delete(`/api/presets/${preset.id}`)).status).toBe(404);
  });

  it("hides another designer's presets (404, not 403) and never lists them", async () => {
    const mine = await designer.post('/api/presets').send({ templateId: template.id, name: 'Maren only', params: {} });
    expect(mine.status).toBe(201);
    const id = mine.body.id as string;
    expect((await otherDesigner.get(`/api/presets/${id}`)).status).toBe(404);
    expect((await otherDesigner.patch(`/api/presets/${id}`).send({ name: 'taken over' })).status).toBe(404);
    expect((await otherDesigner.delete(`/api/presets/${id}`)).status).toBe(404);
    const theirs = await otherDesigner.get('/api/presets');
    expect(theirs.body.presets.map((p: { id: string }) => p.id)).not.toContain(id);
    // The same name is free for the other designer: uniqueness is per owner.
    const same = await otherDesigner
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Maren only', params: {} });
    expect(same.status).toBe(201);
    // Still there and unchanged for its owner.
    const still = await designer.get(`/api/presets/${id}`);
    expect(still.body.name).toBe('Maren only');
  });

  it('answers 409 for a name already used for this template by the same designer, on create and on rename', async () => {
    const first = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Blue tit 25', params: {} });
    expect(first.status).toBe(201);
    const again = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Blue tit 25', params: {} });
    expect(again.status).toBe(409);
    expect(again.body.error.message).toMatch(/^You already have a preset called "Blue tit 25"/);
    const second = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Great tit 28', params: {} });
    const rename = await designer.patch(`/api/presets/${second.body.id}`).send({ name: 'Blue tit 25' });
    expect(rename.status).toBe(409);
    // Renaming a preset to its own name is not a conflict.
    const self = await designer.patch(`/api/presets/${first.body.id}`).send({ name: 'Blue tit 25' });
    expect(self.status).toBe(200);
  });

  it('rejects out-of-range, unknown and mistyped parameters with a 400 naming the field and its range', async () => {
    const key = sizeParam!.key;
    const tooBig = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Too big', params: { [key]: sizeParam!.max! + 10 } });
    expect(tooBig.status).toBe(400);
    expect(tooBig.body.error.message).toContain(sizeParam!.label);
    // The allowed range is spelled out with the template's own limits.
    expect(tooBig.body.error.message).toContain(String(sizeParam!.min));
    expect(tooBig.body.error.message).toContain(String(sizeParam!.max));
    expect(tooBig.body.error.details[0].path).toBe(`params.${key}`);

    const unknown = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Unknown', params: { wingspanMm: 3 } });
    expect(unknown.status).toBe(400);
    expect(unknown.body.error.message).toContain('wingspanMm');

    const mistyped = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Mistyped', params: { [key]: 'wide' } });
    expect(mistyped.status).toBe(400);
    expect(mistyped.body.error.message).toContain(sizeParam!.label);
    expect(mistyped.body.error.details[0].path).toBe(`params.${key}`);

    const created = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Patch check', params: {} });
    const badPatch = await designer
      .patch(`/api/presets/${created.body.id}`)
      .send({ params: { [key]: sizeParam!.min! - 5 } });
    expect(badPatch.status).toBe(400);
    expect(badPatch.body.error.message).toContain(sizeParam!.label);
  });

  it('rejects an unknown template, a missing name and an empty update', async () => {
    const noTemplate = await designer
      .post('/api/presets')
      .send({ templateId: 'no-such-template', name: 'X', params: {} });
    expect(noTemplate.status).toBe(400);
    expect(noTemplate.body.error.message).toBe('There is no template called "no-such-template".');
    const noName = await designer.post('/api/presets').send({ templateId: template.id, name: '   ', params: {} });
    expect(noName.status).toBe(400);
    expect(noName.body.error.message).toBe('Give the preset a name.');
    expect(noName.body.error.details[0].path).toBe('name');
    const created = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Empty patch', params: {} });
    const empty = await designer.patch(`/api/presets/${created.body.id}`).send({});
    expect(empty.status).toBe(400);
  });

  it('accepts only PNG data URLs of limited size as thumbnails', async () => {
    const jpeg = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Jpeg thumb', params: {}, thumbnail: 'data:image/jpeg;base64,/9j/4AAQ' });
    expect(jpeg.status).toBe(400);
    expect(jpeg.body.error.message).toBe('The preview picture must be a PNG image.');
    expect(jpeg.body.error.details[0].path).toBe('thumbnail');
    const script = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Script thumb', params: {}, thumbnail: 'javascript:alert(1)' });
    expect(script.status).toBe(400);
    const notBase64 = await designer.post('/api/presets').send({
      templateId: template.id,
      name: 'Odd thumb',
      params: {},
      thumbnail: 'data:image/png;base64,<svg onload=x>',
    });
    expect(notBase64.status).toBe(400);
    const huge = `data:image/png;base64,${'A'.repeat(PRESET_THUMBNAIL_MAX_CHARS)}`;
    const tooLarge = await designer
      .post('/api/presets')
      .send({ templateId: template.id, name: 'Huge thumb', params: {}, thumbnail: huge });
    expect(tooLarge.status).toBe(400);
    expect(tooLarge.body.error.message).toBe('The preview picture is too large.');
  });

  it('is for designers: signed-out 401, other roles 403', async () => {
    const anonymous = await t.agent(null);
    expect((await anonymous.get('/api/presets')).status).toBe(401);
    for (const role of ['catalogue_manager', 'sales', 'admin'] as const) {
      const agent = await t.agent(role);
      expect((await agent.get('/api/presets')).status).toBe(403);
      expect((await agent.post('/api/presets').send({ templateId: template.id, name: 'N', params: {} })).status).toBe(
        403,
      );
    }
  });
});
