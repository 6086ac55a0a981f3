import type { EquipmentDetail, EquipmentItem } from '@shared/contracts/equipment';

export type { EquipmentDetail, EquipmentItem };
