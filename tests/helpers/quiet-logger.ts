import { createLogger } from '../../server/logger.ts';

export const quietLogger = () => createLogger('silent');
