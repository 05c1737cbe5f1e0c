/** Parse + evaluate in one call. */
import { parseNote } from '../notation/parse';
import { evaluate } from './evaluate';
import type { Analysis, EvaluateSettings } from './types';

/** Parses a Markdown note and evaluates it (`parseNote` + {@link evaluate}), with line numbers in messages. */
export function analyzeNote(text: string, settings?: Partial<EvaluateSettings>): Analysis {
  return evaluate(parseNote(text), settings, text);
}
