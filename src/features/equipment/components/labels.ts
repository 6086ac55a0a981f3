import { formatLength, type LengthSystem } from '@shared/domain/units';

export const lengthText = (m: number | null | undefined, system: LengthSystem) => (m == null ? '—' : formatLength(m, system));
export const numberOrNull = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));
