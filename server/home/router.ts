// HTTP for the home page.
import { defineFeature, route } from '../lib/route';
import { homePage } from './service';

export const homeFeature = defineFeature('home', [
  route({
    method: 'get', path: '/api/home', tag: 'home', permission: 'signed-in',
    summary: 'Home page: my projects with best builds, recent uploads',
    handle: ({ ctx, user }) => homePage(ctx, user),
  }),
]);
