/**
 * Server-sent events for one study: the worker writes progress to the database; this reads
 * it every few hundred milliseconds and sends what changed. Events: `progress` (the study
 * without its result) while it runs, then one `end` (with the result) and the stream closes.
 * A client without EventSource polls GET …/studies/:sid instead.
 */
import type { Request, Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { toStudyDto, toStudySummaryDto } from './dto';
import { StudySchema } from './study.entity';

const POLL_MS = 300;
const KEEPALIVE_MS = 15_000;
const FINISHED = new Set(['done', 'failed', 'cancelled']);

export function streamStudyEvents(
  em: EntityManager,
  req: Request,
  res: Response,
  id: string,
): void {
  res.status(200);
  res.setHeader('Content-Type', 'text/event-stream; charset=utf-8');
  // no-transform: a compressing proxy or middleware must not buffer the stream.
  res.setHeader('Cache-Control', 'no-cache, no-transform');
  res.setHeader('X-Accel-Buffering', 'no');
  res.flushHeaders();
  const flush = () => (res as Response & { flush?: () => void }).flush?.();
  const send = (event: string, data: unknown) => {
    res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    flush();
  };
  let last = '';
  let closed = false;
  let lastWrite = Date.now();
  const tick = async () => {
    if (closed) return;
    try {
      const fork = em.fork();
      const study = await fork.findOne(
        StudySchema,
        { id },
        { populate: ['createdBy'], exclude: ['checkpoint', 'document', 'result'] },
      );
      if (closed) return;
      if (!study) {
        send('end', null);
        return stop();
      }
      if (FINISHED.has(study.status)) {
        const full = await fork.findOne(StudySchema, { id }, { populate: ['createdBy'] });
        if (!closed && full) send('end', toStudyDto(full));
        return stop();
      }
      const dto = toStudySummaryDto(study);
      const key = JSON.stringify(dto);
      if (key !== last) {
        last = key;
        lastWrite = Date.now();
        send('progress', dto);
      } else if (Date.now() - lastWrite > KEEPALIVE_MS) {
        lastWrite = Date.now();
        res.write(': keep-alive\n\n');
        flush();
      }
    } catch (err) {
      send('error', { message: err instanceof Error ? err.message : String(err) });
      return stop();
    }
    timer = setTimeout(() => void tick(), POLL_MS);
  };
  let timer: NodeJS.Timeout | undefined;
  const stop = () => {
    closed = true;
    if (timer) clearTimeout(timer);
    res.end();
  };
  req.on('close', () => {
    closed = true;
    if (timer) clearTimeout(timer);
  });
  void tick();
}
