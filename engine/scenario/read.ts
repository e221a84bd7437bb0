/** Text to normalised scenario in one call, for the CLI and the app: parse, validate, throw on errors. */
import { ScenarioError } from './issues.ts';
import { parseScenarioText, type ParseOptions } from './parse.ts';
import { validateScenario } from './validate.ts';
import type { Issue, NormalisedScenario } from './types.ts';

export function readScenario(text: string, opts?: ParseOptions): { scenario: NormalisedScenario; warnings: Issue[] } {
  const result = validateScenario(parseScenarioText(text, opts));
  if (!result.ok) throw new ScenarioError(result.errors, `the scenario has ${result.errors.length} error${result.errors.length === 1 ? '' : 's'}`);
  return { scenario: result.scenario, warnings: result.warnings };
}
