// Worker thread (piscina): checks a revision off the main thread, so the API stays responsive
// while a large panel is verified.
import { checkRevision, type EngineInput } from '../modules/programs/engine';

export default function check(input: EngineInput) {
  return checkRevision(input);
}
