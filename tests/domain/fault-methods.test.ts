import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import {
  faultSituation,
  LOCATE_METHODS,
  METHOD_DEFINITIONS,
  methodsForFault,
  type LocateMethod,
  type MethodInput,
} from '../../shared/domain/fault-methods';
import { faultLocationRequestSchema } from '../../shared/schemas/fault-location';
import { FAULT_KINDS, type FaultKind } from '../../shared/schemas/faults';

const CONDUCTORS = ['A', 'B', 'C', 'A-B', 'A-C', 'B-C', 'piste', 'piste-C'];

/** What each method needs, as the product brief lists the published methods (PRODUCT.md, "Fault location"). */
const NEEDS: Record<LocateMethod, ReadonlyArray<ReturnType<typeof faultSituation>>> = {
  // loop resistance from one end / both ends: a short between two conductors (a conductor to C is one too)
  'loop-one-end': ['short', 'earth'],
  'loop-both-ends': ['short', 'earth'],
  // the Murray loop bridge: a conductor-to-earth/screen fault, with a sound conductor
  murray: ['earth'],
  // capacitance ratio: an open conductor
  capacitance: ['open'],
  // TDR: an open (positive reflection) or a short (negative); a series resistance reflects weakly
  tdr: ['short', 'earth', 'open', 'high-resistance'],
  // a flex test result (position found by hand): any fault
  flex: ['short', 'earth', 'open', 'high-resistance', 'intermittent'],
};

describe('which methods fit a fault', () => {
  test.each(FAULT_KINDS.flatMap((kind) => CONDUCTORS.map((c) => [kind, c] as [FaultKind, string])))(
    'a %s fault on %s is offered only methods whose requirement it meets, each with a one-line reason',
    (kind, conductors) => {
      const situation = faultSituation(kind, conductors);
      const offered = methodsForFault(kind, conductors);
      expect(offered.length).toBeGreaterThan(0);
      expect(new Set(offered.map((o) => o.method)).size).toBe(offered.length);
      for (const { method, reason } of offered) {
        expect(NEEDS[method], `${method} for a ${situation}`).toContain(situation);
        expect(reason.length).toBeGreaterThan(20);
        expect(reason).not.toMatch(/\n/);
      }
    },
  );

  test('a high-resistance line is never offered a method for a dead short first; what is offered says why', () => {
    // PRODUCT.md: loop resistance from one end is for a low-resistance short between two conductors
    for (const conductors of ['A', 'B', 'C', 'A-B']) {
      const offered = methodsForFault('high-resistance', conductors);
      expect(offered.map((o) => o.method)).toEqual(['flex', 'tdr']);
      expect(offered[0]!.reason).toMatch(/no loop, bridge or capacitance method applies/);
    }
    expect(METHOD_DEFINITIONS['loop-one-end'].suits).toMatch(/dead short/);
  });

  test('the order per situation: short between conductors, fault to earth, open line', () => {
    // PRODUCT.md: loop from both ends eliminates the fault's own resistance, so it comes before one end;
    // the Murray loop for a conductor-to-earth fault when a sound conductor exists; capacitance for an open.
    expect(methodsForFault('short', 'A-B').map((o) => o.method)).toEqual(['loop-both-ends', 'loop-one-end', 'tdr', 'flex']);
    expect(methodsForFault('short', 'A-C').map((o) => o.method)).toEqual(['murray', 'loop-both-ends', 'loop-one-end', 'tdr', 'flex']);
    expect(methodsForFault('open', 'C').map((o) => o.method)).toEqual(['capacitance', 'tdr', 'flex']);
    expect(methodsForFault('open', 'piste-C').map((o) => o.method)).toEqual(['flex']);
    expect(methodsForFault('intermittent', 'A').map((o) => o.method)).toEqual(['flex']);
  });

  test('the Murray loop names the faulted line and the sound line to loop it with', () => {
    expect(methodsForFault('short', 'A-C')[0]!.reason).toMatch(/^Line A is faulted to earth \(line C\) and line B can be the sound line/);
    expect(methodsForFault('short', 'B-C')[0]!.reason).toMatch(/^Line B is faulted to earth \(line C\) and line A can be the sound line/);
  });
});

describe('one definition of each method’s inputs, used by the request schema', () => {
  /** The JSON schema of one method's body, as zod builds it from the shared schema. */
  const bodyOf = (method: string) => {
    const union = z.toJSONSchema(faultLocationRequestSchema, { io: 'input' }) as {
      anyOf?: Array<{ properties: Record<string, unknown>; required?: string[] }>;
      oneOf?: Array<{ properties: Record<string, unknown>; required?: string[] }>;
    };
    const variants = union.oneOf ?? union.anyOf ?? [];
    return variants.find((v) => (v.properties.method as { const?: string }).const === method)!;
  };

  test.each([...LOCATE_METHODS])('%s: the body has exactly the defined inputs, required as defined', (method) => {
    const inputs: readonly MethodInput[] = METHOD_DEFINITIONS[method].inputs;
    const body = bodyOf(method);
    expect(Object.keys(body.properties).sort()).toEqual(['method', ...inputs.map((i) => i.name)].sort());
    expect([...(body.required ?? [])].sort()).toEqual(['method', ...inputs.filter((i) => i.required).map((i) => i.name)].sort());
  });

  test.each(
    LOCATE_METHODS.flatMap((method) => (METHOD_DEFINITIONS[method].inputs as readonly MethodInput[]).map((i) => [method, i] as const)),
  )('%s: a wrong %o is refused naming it with the defined sentence', (method, input) => {
    const result = faultLocationRequestSchema.safeParse({ method, [input.name]: 'x' });
    expect(result.success).toBe(false);
    const issue = result.error!.issues.find((i) => i.path[0] === input.name)!;
    expect(issue.message).toBe(`${input.name} must be a number (${input.describe})`);
  });

  test('the Murray loop’s arms are named by what they are joined to', () => {
    const names = METHOD_DEFINITIONS.murray.inputs.map((i) => i.name);
    expect(names).toEqual(['lengthM', 'faultedArm', 'soundArm']);
    expect(faultLocationRequestSchema.safeParse({ method: 'murray', lengthM: 600, faultedArm: 1, soundArm: 3 }).success).toBe(true);
  });
});
