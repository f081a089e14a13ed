/**
 * Bad template input: an unknown template, an unknown parameter or a value outside its declared range.
 * `field` names the offending parameter (or `templateId`); the message says what is allowed.
 */
export class TemplateParamError extends Error {
  /**
   * @param field - the parameter key (or `templateId`) at fault
   * @param message - a sentence naming the field and its allowed values
   */
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'TemplateParamError';
  }
}
