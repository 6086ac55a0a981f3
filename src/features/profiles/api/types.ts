import type { ProfileDetail, ProfileSummary } from '@shared/contracts/profiles';

export type { ProfileDetail, ProfileSummary };
