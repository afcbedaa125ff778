/**
 * Actuator and indicator colours. IEC 60073 and IEC 60204-1 10.2.1 / 10.3.2 give the meanings:
 * red emergency (also stop), yellow abnormal (amber lamps are yellow in the standard), green
 * normal / start, blue mandatory action, white / grey / black no special meaning. The panel
 * layout chooses; North American trainers often light red for "running" (common practice).
 */
import { z } from 'zod';

export const ColourSchema = z.enum(['red', 'yellow', 'green', 'blue', 'white', 'grey', 'black']);
export type Colour = z.infer<typeof ColourSchema>;
