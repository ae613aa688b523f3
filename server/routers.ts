// Feature routers beyond the core (gains, review, designs, surface, proposals) are listed here.
import type { Router } from 'express';
import type { AppContext } from './context';

export const extraRouters: ((ctx: AppContext) => Router)[] = [];
