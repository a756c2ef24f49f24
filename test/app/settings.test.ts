import { describe, expect, it } from 'vitest';
import { loadHighsSolver, planUseCase, QUIET_HOOKS } from '../../src/index.js';
import { sizeUseCase } from '../../src/app/size/sizeUseCase.js';
import { sweepUseCase } from '../../src/app/sweep/sweepUseCase.js';
import { InputError, type InputProblem } from '../../src/errors/inputError.js';
import { main } from '../../src/cli/main.js';
import { jsonText } from '../../src/io/planOutputs.js';

// A use case checks its settings object once, at its start, with the rules the command line uses
// (app/settingRules.ts, app/settingSchemas.ts): a library caller gets every wrong field as a problem
// `settings: FIELD: ...`, and a correct object gives what the command gives.

const S = 'scenarios/halvorn/scenario.json';

async function problemsOf(run: () => unknown): Promise<string[]> {
  try {
    await run();
  } catch (err) {
    if (err instanceof InputError) return err.problems.map((p: InputProblem) => `${p.field}: ${p.message}`);
    throw err;
  }
  throw new Error('no InputError');
}

describe('settings checked once by the use case', () => {
  it('plan: an alpha outside [0.001, 0.5), an unknown policy and an empty --out are each named', async () => {
    const problems = await problemsOf(() => planUseCase({ inputs: { scenario: S }, alpha: 0.7, policy: 'greedy' as never, out: '' }));
    expect(problems).toEqual(['alpha: alpha must be a number in [0.001, 0.5)', expect.stringMatching(/^policy: /), 'out: the path is empty; give a file or folder name (is a shell variable unset?)']);
  });

  it('sweep: an alpha given twice, --to before --from, the root folder as --out', async () => {
    const problems = await problemsOf(() =>
      sweepUseCase({ inputs: { scenario: S }, from: '2026-03-02', to: '2026-03-01', alphas: [0.1, 0.1], policies: ['quantile'], unaccepted: ['follow-plan'], out: '/' }),
    );
    expect(problems.sort()).toEqual(['alphas: each value may be given once', 'out: / is the root folder; give a folder for the outputs, e.g. runs/out', 'to: --to 2026-03-01 is before --from 2026-03-02']);
  });

  it('size: --alpha best over a single day and alphas without best', async () => {
    const costs = { capexPerMwh: 1, capexPerMw: 1, lifeYears: 15, discountRate: 0.07 };
    const base = { inputs: { scenario: S }, from: '2026-03-01', to: '2026-03-01', energiesMwh: [10], powersMw: [5], policies: ['quantile' as const], costs, out: 'never-written' };
    expect(await problemsOf(() => sizeUseCase({ ...base, alpha: 'best' }))).toEqual(['alpha: best needs at least 2 days: it chooses on the first half and scores on the second']);
    expect(await problemsOf(() => sizeUseCase({ ...base, alpha: 0.1, alphas: [0.1] }))).toEqual(['alphas: is used only with --alpha best']);
  });

  it('plan of the demo day: the summary the use case returns is the one `quantbid plan --json` prints', async () => {
    const done = planUseCase({ inputs: { scenario: S }, policy: 'quantile' });
    let stdout = '';
    const code = await main(['node', 'quantbid', 'plan', '--scenario', S, '--policy', 'quantile', '--json'], { stdout: (s) => void (stdout += s), stderr: () => undefined, stderrIsTerminal: false });
    expect(code).toBe(0);
    expect(stdout).toBe(jsonText(done.summary));
    expect(done.summary.day).toBe('2027-01-01');
  });

  it('plan of the demo day with the default policy (auto): the use case, given the LP solver, returns what `quantbid plan --json` prints', async () => {
    const done = planUseCase({ inputs: { scenario: S } }, QUIET_HOOKS, { lpSolver: await loadHighsSolver() });
    let stdout = '';
    const code = await main(['node', 'quantbid', 'plan', '--scenario', S, '--json'], { stdout: (s) => void (stdout += s), stderr: () => undefined, stderrIsTerminal: false });
    expect(code).toBe(0);
    expect(stdout).toBe(jsonText(done.summary));
    expect(done.summary.policy).toBe('auto');
    // Without the solver the default cannot plan: a fault of the caller, named.
    expect(() => planUseCase({ inputs: { scenario: S } })).toThrow(/needs tools\.lpSolver \(loadHighsSolver\)/);
  });
});
