import { Router } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import { studySpecSchema } from '../../shared/schema/studies';
import { chainRole, currentUser, loadedChain, uuidParam } from '../common/roles';
import { parseOr422 } from '../common/validate';
import { toStudyDto, toStudySummaryDto } from './dto';
import { streamStudyEvents } from './events';
import type { StudyLimits } from './limits';
import type { StudyQueue } from './queue';
import { cancelStudy, createStudy, findStudy } from './service';
import { StudySchema } from './study.entity';

/**
 * Studies of a chain, under /api/chains/:id/studies: viewers list and read them (and follow
 * one's progress as server-sent events); editors start and cancel them.
 */
export function chainStudiesRouter(
  em: EntityManager,
  queue: StudyQueue,
  limits: StudyLimits,
): Router {
  const router = Router();
  router.post('/:id/studies', chainRole(em, 'editor'), async (req, res) => {
    const spec = parseOr422(studySpecSchema, req.body);
    const study = await createStudy(em, queue, limits, loadedChain(res), currentUser(req), spec);
    res.status(202).json(toStudyDto(study));
  });
  router.get('/:id/studies', chainRole(em, 'viewer'), async (_req, res) => {
    const studies = await em.find(
      StudySchema,
      { chain: loadedChain(res).id },
      {
        orderBy: { createdAt: 'desc' },
        limit: 50,
        populate: ['createdBy'],
        exclude: ['result', 'checkpoint', 'document'],
      },
    );
    res.json(studies.map(toStudySummaryDto));
  });
  router.get('/:id/studies/:sid', chainRole(em, 'viewer'), async (req, res) => {
    res.json(toStudyDto(await findStudy(em, loadedChain(res), uuidParam(req, 'sid', 'study'))));
  });
  router.get('/:id/studies/:sid/events', chainRole(em, 'viewer'), async (req, res) => {
    const study = await findStudy(em, loadedChain(res), uuidParam(req, 'sid', 'study'));
    streamStudyEvents(em, req, res, study.id);
  });
  router.post('/:id/studies/:sid/cancel', chainRole(em, 'editor'), async (req, res) => {
    const study = await findStudy(em, loadedChain(res), uuidParam(req, 'sid', 'study'));
    res.status(202).json(toStudyDto(await cancelStudy(em, study)));
  });
  return router;
}
