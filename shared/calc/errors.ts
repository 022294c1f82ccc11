/**
 * Thrown by a calculator when inputs that are valid one by one describe something the model cannot solve
 * (a load larger than the packs can deliver, a source that cannot charge at all). The API turns it into a
 * 422 `calculation-error` problem naming the field in `pointer` when there is one.
 */
export class CalcError extends Error {
  override name = 'CalcError';
  readonly code: string;
  /** JSON Pointer into the request body, as a URI fragment ("#/load/powerW"), when one field is at fault. */
  readonly pointer?: string;

  constructor(code: string, message: string, pointer?: string) {
    super(message);
    this.code = code;
    this.pointer = pointer;
  }
}
