// Worker-thread entry point (e.g. a piscina pool's `filename`): receives a structured-cloned
// VerifyInput (typed arrays survive the clone) and returns the plain result object.
import { verify } from './verify';
import type { VerifyInput, VerifyOptions, VerifyResult } from './types';

export interface VerifyTask {
  input: VerifyInput;
  options?: VerifyOptions;
}

export default function runVerifyTask(task: VerifyTask): VerifyResult {
  return verify(task.input, task.options ?? {});
}
