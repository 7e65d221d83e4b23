// Job names and payload schemas shared by whoever queues a job and the worker that runs it.
import { z } from 'zod';

export const JOBS = {
  heartbeat: 'worker.heartbeat',
} as const;

export const heartbeatJobSchema = z.object({
  name: z.string().min(1).max(120),
  host: z.string().max(255),
  pid: z.number().int().nonnegative(),
  startedAt: z.string().datetime(),
  beatSeconds: z.number().int().positive(),
});
export type HeartbeatJob = z.infer<typeof heartbeatJobSchema>;
