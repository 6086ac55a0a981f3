import { z } from 'zod';
import { EQUIPMENT_KINDS, TEMPERATURE_RANGE_C, TEST_KINDS } from '../domain/limits';
import { typedName } from './common';

const profileName = typedName({
  required: 'A limit profile needs a name',
  max: 120,
  tooLong: 'Keep the profile name under 120 characters',
});

const ohm = (field: string) =>
  z
    .number({ error: (issue) => (issue.input === undefined ? `${field} is required` : `${field} must be a number of ohms`) })
    .positive({ error: `${field} must be more than 0 Ω` });

export const limitRuleSchema = z
  .strictObject({
    id: typedName({ required: 'Every rule needs an id', max: 100, tooLong: 'Keep rule ids under 100 characters' }),
    equipmentKind: z.enum(EQUIPMENT_KINDS, { error: `equipmentKind must be one of: ${EQUIPMENT_KINDS.join(', ')}` }),
    testKind: z.enum(TEST_KINDS, { error: `testKind must be one of: ${TEST_KINDS.join(', ')}` }),
    maxOhm: ohm('maxOhm').optional(),
    maxOhmPerMetre: ohm('maxOhmPerMetre').optional(),
    connectorAllowanceOhm: z.number().min(0, { error: 'connectorAllowanceOhm cannot be negative' }).optional(),
    minOhm: ohm('minOhm').optional(),
    nearLimitFraction: z
      .number()
      .gt(0, { error: 'nearLimitFraction must be between 0 and 1, e.g. 0.9' })
      .lt(1, { error: 'nearLimitFraction must be between 0 and 1, e.g. 0.9' })
      .optional(),
    nearMinOhm: ohm('nearMinOhm').optional(),
    // The source is printed beside each verdict and on the certificate: cleaned like a name.
    source: typedName({
      required: 'Every rule needs a source: a rule article, a handbook, or "House rule"',
      max: 300,
      tooLong: 'Keep the source under 300 characters',
    }),
    houseRule: z.boolean(),
    note: z.string().max(1000).optional(),
  })
  .superRefine((rule, ctx) => {
    const hasMax = rule.maxOhm !== undefined || rule.maxOhmPerMetre !== undefined;
    const hasMin = rule.minOhm !== undefined;
    if (!hasMax && !hasMin) {
      ctx.addIssue({
        code: 'custom',
        path: ['maxOhm'],
        message: 'A rule needs a maximum (maxOhm or maxOhmPerMetre) or a minimum (minOhm)',
      });
    }
    if (hasMax && hasMin) {
      ctx.addIssue({ code: 'custom', path: ['minOhm'], message: 'A rule is either a maximum or a minimum; split it into two rules' });
    }
    if (rule.testKind === 'insulation' && hasMax) {
      ctx.addIssue({ code: 'custom', path: ['maxOhm'], message: 'An insulation rule sets a minimum (minOhm), not a maximum' });
    }
    if (rule.testKind !== 'insulation' && hasMin) {
      ctx.addIssue({ code: 'custom', path: ['minOhm'], message: `A ${rule.testKind} rule sets a maximum, not a minimum` });
    }
    if (rule.nearMinOhm !== undefined && rule.minOhm !== undefined && rule.nearMinOhm <= rule.minOhm) {
      ctx.addIssue({ code: 'custom', path: ['nearMinOhm'], message: 'nearMinOhm must be above minOhm' });
    }
    if (rule.connectorAllowanceOhm !== undefined && rule.maxOhmPerMetre === undefined) {
      ctx.addIssue({ code: 'custom', path: ['connectorAllowanceOhm'], message: 'connectorAllowanceOhm only applies with maxOhmPerMetre' });
    }
  });

export const limitProfileRulesSchema = z
  .array(limitRuleSchema)
  .min(1, { error: 'A limit profile needs at least one rule' })
  .superRefine((rules, ctx) => {
    const ids = new Set<string>();
    const targets = new Set<string>();
    rules.forEach((rule, index) => {
      if (ids.has(rule.id)) ctx.addIssue({ code: 'custom', path: [index, 'id'], message: `Rule id “${rule.id}” is used twice` });
      ids.add(rule.id);
      const target = `${rule.equipmentKind}/${rule.testKind}`;
      if (targets.has(target)) {
        ctx.addIssue({
          code: 'custom',
          path: [index, 'testKind'],
          message: `There is already a ${rule.testKind} rule for ${rule.equipmentKind}; one rule per equipment kind and test`,
        });
      }
      targets.add(target);
    });
  });

/** The reference temperature copper readings are corrected to (a house rule); null: judged as measured. */
export const temperatureReferenceSchema = z
  .number({ error: 'temperatureReferenceC must be a number of °C, or null to judge readings as measured' })
  .min(TEMPERATURE_RANGE_C.min, { error: `temperatureReferenceC must be at least ${TEMPERATURE_RANGE_C.min} °C` })
  .max(TEMPERATURE_RANGE_C.max, { error: `temperatureReferenceC must be at most ${TEMPERATURE_RANGE_C.max} °C` })
  .nullable();

export const limitProfileSchema = z.strictObject({
  name: profileName,
  version: z.number().int().positive(),
  rules: limitProfileRulesSchema,
  loopRequired: z.array(z.enum(EQUIPMENT_KINDS)).optional(),
  temperatureReferenceC: temperatureReferenceSchema.optional(),
});

export type LimitRuleInput = z.infer<typeof limitRuleSchema>;
export type LimitProfileInput = z.infer<typeof limitProfileSchema>;

/** Copy a profile into a new lineage (version 1) under a new name. */
export const copyProfileSchema = z.strictObject({
  name: profileName,
});

/** Edit a profile: the server stores it as a new version of the same lineage. */
export const updateProfileSchema = z.strictObject({
  name: profileName.optional(),
  rules: limitProfileRulesSchema,
  loopRequired: z.array(z.enum(EQUIPMENT_KINDS, { error: `loopRequired lists equipment kinds: ${EQUIPMENT_KINDS.join(', ')}` })).optional(),
  temperatureReferenceC: temperatureReferenceSchema.optional(),
  notes: z.string().trim().max(2000).nullable().optional(),
});
export type UpdateProfileInput = z.input<typeof updateProfileSchema>;
