/**
 * The kinds of absorbing layer, named once: the scenario file chooses one (absorber.kind), the assembly
 * builds its stretches (engine/assembly/layers.ts), the problem predicts what it reflects.
 *   discrete  a constant complex stretch per layer element, the p-point Gauss rule along the stretched axis
 *   constant  the same stretches with the full (p + 1)-point rule
 *   smooth    a graded profile, full rule
 */
export type AbsorberKind = 'discrete' | 'constant' | 'smooth';
