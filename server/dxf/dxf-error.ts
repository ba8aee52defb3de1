/** What went wrong with a DXF file, for callers that map errors to responses. */
export type DxfErrorCode =
  | 'empty'
  | 'not-dxf'
  | 'binary'
  | 'truncated'
  | 'malformed'
  | 'no-entities'
  | 'missing-block'
  | 'recursive-block'
  | 'too-many-entities'
  | 'too-large';

export interface DxfErrorDetails {
  /** 1-based line of the file where the problem was found, when known. */
  line?: number;
  /** Name of the block involved, when the problem is in or about a block. */
  block?: string;
}

/**
 * A DXF file Gridset cannot read. The message is a full sentence meant for the person who
 * uploaded the file; `code`, `line` and `block` are for programs.
 */
export class DxfError extends Error {
  override readonly name = 'DxfError';
  readonly code: DxfErrorCode;
  readonly line: number | undefined;
  readonly block: string | undefined;

  constructor(code: DxfErrorCode, message: string, details: DxfErrorDetails = {}) {
    super(message);
    this.code = code;
    this.line = details.line;
    this.block = details.block;
  }
}
