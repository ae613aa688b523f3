// Sign-in, invitation and people schemas shared by the client and the server.
import { z } from 'zod';
import { ROLES } from './project';

export const loginSchema = z.object({
  email: z.string().trim().toLowerCase().email('an e-mail address like name@lab.example'),
  password: z.string().min(1, 'required').max(200),
});

export const passwordRule = z.string().min(10, 'at least 10 characters').max(200);

export const inviteCreateSchema = z.object({
  email: z.string().trim().toLowerCase().email('an e-mail address like name@lab.example'),
  role: z.enum(ROLES),
  labId: z.number().int().positive().nullish(),
});

export const inviteAcceptSchema = z.object({
  name: z.string().trim().min(2, 'at least 2 characters').max(100),
  password: passwordRule,
});

export const personUpdateSchema = z.object({
  name: z.string().trim().min(2).max(100).optional(),
  isAdmin: z.boolean().optional(),
  labId: z.number().int().positive().nullable().optional(),
  disabled: z.boolean().optional(),
});

export const membershipSetSchema = z.object({
  userId: z.number().int().positive(),
  role: z.enum(ROLES),
});

export const labCreateSchema = z.object({
  name: z.string().trim().min(2).max(100),
  kind: z.enum(['home', 'partner']),
  city: z.string().trim().max(100).nullish(),
});

export const apiTokenCreateSchema = z.object({
  name: z.string().trim().min(1).max(60),
});
