/** Bad art or options: the caller gets `message` as is. Anything else is a bug. */
export class OutlineInputError extends Error {
  constructor(
    readonly code:
      'not-an-image' | 'unsupported-format' | 'corrupt' | 'too-many-pixels' | 'too-small' | 'no-visible-art' | 'too-large-output',
    message: string,
  ) {
    super(message);
    this.name = 'OutlineInputError';
  }
}
