import type { z } from 'zod';
import type { IndexedMesh } from '../shared/schemas/mesh';
import type { NestBoxFacts } from '../shared/schemas/nestbox';
import type { BuildContext } from './lib/BuildContext';

/** Units a template parameter may carry (millimetres inside; inches only at the edge of the UI). */
export type ParameterUnit = 'mm' | 'deg' | 'count' | '%' | '';

/**
 * What every template field carries in `.meta()` beside its zod range and default.
 * `step` is the slider step in the field's unit.
 */
export interface ParameterMeta {
  label: string;
  unit: ParameterUnit;
  step?: number;
  help: string;
}

/** One printable body of a template, in its build orientation (+z up, resting on z = 0). */
export interface TemplatePart {
  /** Stable part name, e.g. `body` or `floor-plug`. */
  name: string;
  /** The part's closed, outward-wound triangle mesh, straight from the kernel (see lib/partMesh.ts). */
  mesh: IndexedMesh;
}

/** What `build(params)` returns: the printable parts and what the box offers a bird. */
export interface TemplateOutput {
  parts: TemplatePart[];
  facts: NestBoxFacts;
}

/**
 * A parametric nest-box template. `parameters` is a zod object whose every field has a range, a default and
 * {@link ParameterMeta}; `build` is pure (no DOM, network, clock or unseeded randomness): the same `version` and
 * parameters always give the same mesh.
 */
export interface Template<S extends z.ZodObject = z.ZodObject> {
  /** Stable identifier used in URLs, presets and exports. */
  id: string;
  /** Bumped whenever the same parameters would give a different mesh. */
  version: number;
  name: string;
  /** One sentence for the template picker. */
  summary: string;
  parameters: S;
  /**
   * How the body stands in use, from its build orientation: `as-built` (printed upright), or `turn-over-y`
   * (printed upside down: turned 180° about y to stand). Drawings and spec sheets show the body standing.
   */
  inUse: 'as-built' | 'turn-over-y';
  /**
   * What the back fits (a trunk, pole, post or wall) and how the box is fixed, as sentences for spec sheets and the
   * shop.
   * @param params - complete parameters
   * @param widthMm - overall width of the body
   */
  mounting(params: z.output<S>, widthMm: number): string;
  /**
   * Limits one parameter puts on another (e.g. the entry must stay under the roof for the chosen cavity depth).
   * parseParams rejects a value outside them with a message naming the field and its allowed range, so `build`
   * never has to change a value silently.
   */
  limits?(params: z.output<S>): ParameterLimits;
  /**
   * Builds the parts. `context` gives the quality (draft while a slider is held, full otherwise: the default) and
   * the reuse of sub-solids whose parameters did not change; a reused sub-solid never changes the mesh.
   */
  build(params: z.output<S>, context?: BuildContext): TemplateOutput;
}

/** A range a parameter must keep given the other parameters, with the reason shown to the designer. */
export interface ParameterLimit {
  minMm?: number;
  maxMm?: number;
  /** Why, as a phrase that follows the range, e.g. `for a 160 mm cavity (the entry stays under the roof)`. */
  because: string;
}

/** Cross-parameter limits by parameter key. */
export type ParameterLimits = Partial<Record<string, ParameterLimit>>;

/** Any registered template, parameters erased. */
export type AnyTemplate = Template<z.ZodObject>;

/** Parameters of a template after defaults are merged and ranges checked. */
export type TemplateParams = Record<string, number | boolean | string>;

/** One parameter as the editor and the CLI see it (read from the zod schema and its meta). */
export interface ParameterDescription {
  key: string;
  label: string;
  unit: ParameterUnit;
  kind: 'number' | 'boolean' | 'choice';
  min?: number;
  max?: number;
  step?: number;
  default: number | boolean | string;
  /** Allowed values of a `choice` parameter. */
  options?: string[];
  help: string;
}
