import type { EventDetail, EventSummary, PlanningPeople, VenuePlan } from '@shared/contracts/plan';

export type { EventDetail, EventSummary, PlanningPeople, VenuePlan };
export type PlanStrip = VenuePlan['strips'][number];
export type PlanPosition = PlanStrip['positions'][number];
export type PlanStep = PlanPosition['steps'][number];
