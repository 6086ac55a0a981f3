import { z } from 'zod';
import { idField } from './common';

export const idParams = z.object({ id: idField });
