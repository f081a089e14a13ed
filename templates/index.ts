/** The templates' public face: the list, the look-up, parameter handling and generation. */
export { TEMPLATES, findTemplate } from './findTemplate';
export { describeParameters } from './lib/describeParameters';
export { parseParams } from './lib/parseParams';
export type { ParseParamsOptions } from './lib/parseParams';
export { liveLimits } from './lib/liveLimits';
export type { LiveLimit, LiveLimits } from './lib/liveLimits';
export { TemplateParamError } from './lib/TemplateParamError';
export { generate, generateDraft } from './generate';
export type { BuiltDesign, GenerateOptions, GenerateResult } from './generate';
export { BuildContext } from './lib/BuildContext';
export type { BuildQuality } from './lib/BuildContext';
export { SolidCache } from './lib/SolidCache';
export type { AnyTemplate, Template, TemplateOutput, TemplatePart, ParameterDescription } from './types';
