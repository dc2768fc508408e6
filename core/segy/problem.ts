/** Builders for SEG-Y input problems (catalogue: core/problems.ts). Messages name place, value, expectation, hint. */
import { InputFileError, type FileProblem, type ProblemCode } from '../problems';

export type ProblemDetails = Omit<FileProblem, 'code' | 'severity' | 'message' | 'file'>;

export function segyError(code: ProblemCode, file: string, message: string, details: ProblemDetails = {}): InputFileError {
  return new InputFileError({ code, severity: 'error', message, file, ...details });
}

export function segyWarning(code: ProblemCode, file: string, message: string, details: ProblemDetails = {}): FileProblem {
  return { code, severity: 'warning', message, file, ...details };
}
