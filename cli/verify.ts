/**
 * quietgrid verify: the built-in verification suite (engine/solve/verify.ts) run on this machine, printed as
 * tables of case, value, tolerance, pass/fail and source, or as JSON. Exit 0 only when every row passes.
 */
import { performance } from 'node:perf_hooks';
import { runVerify, VERIFY_GROUP_IDS, type VerifyGroupId, type VerifyTable } from '../engine/solve/verify.ts';
import { EXIT_FAILED, EXIT_OK, UsageError, parseOptions, type Io } from './common.ts';

export const VERIFY_HELP = `Usage: quietgrid verify [--json] [--only GROUPS]

Runs the built-in verification suite: small problems with published answers, solved by the same
engine as your scenarios, each row with its source, tolerance, the value found and pass or FAIL.
  outgoing   a plane wave in a long duct: rigid end and 1-4 layers of each absorber kind
  pade       measured reflection of discrete layers against the Padé formula (p = 3, 4)
  monopole   a point source in free field with face, edge and corner layers, against
             refinement and the number of layers
  duct       expansion chamber (Davis et al. 1954), closed side stub, plane-wave chain
  porous     a rigid-backed porous layer against its normal-incidence absorption
Under a minute on two cores; the monopole group takes most of it.

Options:
  --json          print one JSON object instead of the tables
  --only GROUPS   run only these groups, separated by commas (e.g. --only pade,duct)
  --help          this text

Exit status: 0 every row passed; 1 a row failed; 2 invalid options.
`;

const OPTIONS = { json: { type: 'boolean' }, only: { type: 'string' }, help: { type: 'boolean' } } as const;

function groups(text: string | undefined): VerifyGroupId[] {
  if (text === undefined) return VERIFY_GROUP_IDS;
  const names = text.split(',').map((t) => t.trim()).filter((t) => t !== '');
  const bad = names.filter((n) => !(VERIFY_GROUP_IDS as string[]).includes(n));
  if (names.length === 0 || bad.length > 0) throw new UsageError(`--only: ${bad.length > 0 ? `unknown group ${bad.map((b) => `"${b}"`).join(', ')}` : 'no group given'}; the groups are ${VERIFY_GROUP_IDS.join(', ')}`);
  return names as VerifyGroupId[];
}

/** A table as fixed-width text: case, value, tolerance, result, source. */
export function formatTable(t: VerifyTable): string[] {
  const head = ['case', 'value', 'tolerance', 'result', 'source'];
  const cells = t.rows.map((r) => [r.case, r.shown, r.tolerance, r.pass ? 'pass' : 'FAIL', r.source]);
  const widths = head.map((h, i) => Math.max(h.length, ...cells.map((c) => c[i].length)));
  const line = (c: string[]) => c.map((v, i) => (i === c.length - 1 ? v : v.padEnd(widths[i]))).join('  ');
  const passed = t.rows.filter((r) => r.pass).length;
  return [
    `${t.title}`,
    line(head),
    line(widths.map((w) => '-'.repeat(w))),
    ...cells.map(line),
    `${t.note} ${passed}/${t.rows.length} passed in ${t.seconds.toFixed(1)} s.`,
    '',
  ];
}

export async function verifyCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('verify', args, OPTIONS);
  if (values.help) {
    io.out(VERIFY_HELP);
    return EXIT_OK;
  }
  if (positionals.length > 0) throw new UsageError(`verify takes no scenario file (got ${positionals.join(' ')}); see quietgrid verify --help`);
  const ids = groups(values.only), now = () => performance.now();
  if (!values.json) io.out(`quietgrid verify: ${ids.join(', ')}\n`);
  const report = runVerify(now, ids, (t) => {
    if (values.json) io.err(`verify: ${t.id} done in ${t.seconds.toFixed(1)} s`);
    else for (const l of formatTable(t)) io.out(l);
  });
  const rows = report.tables.flatMap((t) => t.rows), failed = rows.filter((r) => !r.pass).length;
  if (values.json) io.out(JSON.stringify(report, null, 2));
  else io.out(failed === 0 ? `All ${rows.length} checks passed in ${report.seconds.toFixed(0)} s.` : `${failed} of ${rows.length} checks FAILED (${report.seconds.toFixed(0)} s).`);
  return failed === 0 ? EXIT_OK : EXIT_FAILED;
}
