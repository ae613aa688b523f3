// Feature routers beyond the core (gains, review, designs, surface, proposals) are listed here.
import type { Router } from 'express';
import type { AppContext } from './context';
import { uploadsRouter } from './uploads/router';
import { durabilityRouter } from './curves/durability';
import { doeRouter } from './doe/router';
import { gainsRouter } from './gains/router';
import { lineageRouter } from './lineage/router';
import { reviewRouter } from './review/router';

export const extraRouters: ((ctx: AppContext) => Router)[] = [];
extraRouters.push(uploadsRouter, durabilityRouter);
extraRouters.push(doeRouter);
extraRouters.push(gainsRouter, lineageRouter, reviewRouter);
