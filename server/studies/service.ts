/**
 * Studies on the web server's side: create (checks, caps, queue), list, read, cancel. The
 * server never runs a study; the worker does.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { ChainDocument } from '../../shared/schema/chain';
import type { StudySpec } from '../../shared/schema/studies';
import { bandGang, estimateWork, readValue, StudySetupError } from '../../shared/engine/studies';
import type { Chain } from '../chains/chain.entity';
import { storedDocument } from '../chains/stored-document';
import { ConflictError, HttpError, NotFoundError } from '../common/errors';
import type { User } from '../users/user.entity';
import type { StudyLimits } from './limits';
import type { StudyQueue } from './queue';
import { StudySchema, type Study } from './study.entity';

export class StudyTooBigError extends HttpError {
  constructor(message: string, details: unknown) {
    super(422, 'study-too-big', message, details);
  }
}

export class TooManyStudiesError extends HttpError {
  constructor(message: string) {
    super(429, 'too-many-studies', message);
  }
}

/** A spec that names what the chain does not have: 422 with the reason. */
export class StudySpecError extends HttpError {
  constructor(message: string) {
    super(422, 'invalid-study', message, [{ path: '', message }]);
  }
}

/** Cheap checks of a spec against the chain (the engine's full checks run in the worker). */
function checkRefs(doc: ChainDocument, spec: StudySpec): void {
  try {
    if (spec.kind === 'band') bandGang(doc, spec).forEach((m) => readValue(doc, m));
    if (spec.kind === 'optimiser') spec.variables.forEach((v) => readValue(doc, v));
    if (
      spec.kind === 'monte-carlo' &&
      !doc.stages.some((s) => Object.values(s.tolerances ?? {}).some((t) => t > 0))
    ) {
      throw new StudySetupError(
        'no stage value has a tolerance: give at least one value a ± % in the editor first',
      );
    }
  } catch (err) {
    if (err instanceof StudySetupError) throw new StudySpecError(err.message);
    throw err;
  }
}

export async function createStudy(
  em: EntityManager,
  queue: StudyQueue,
  limits: StudyLimits,
  chain: Chain,
  user: User,
  spec: StudySpec,
): Promise<Study> {
  const doc = storedDocument(chain.document);
  checkRefs(doc, spec);
  const work = estimateWork(doc, spec);
  if (work.units > limits.maxWork) {
    throw new StudyTooBigError(
      `this study is too big: ${work.formula} = ${work.units.toLocaleString('en')}, above the cap of ${limits.maxWork.toLocaleString('en')}; ask for fewer trials, positions, iterations or sweep points`,
      { cap: 'trials × points × stages', units: work.units, max: limits.maxWork },
    );
  }
  const active = await em.count(StudySchema, {
    createdBy: user.id,
    status: { $in: ['queued', 'running'] },
  });
  if (active >= limits.maxActivePerUser) {
    throw new TooManyStudiesError(
      `you already have ${active} studies queued or running (at most ${limits.maxActivePerUser}): wait for one to finish or cancel one`,
    );
  }
  const study = em.create(StudySchema, {
    chain,
    chainVersion: chain.version,
    createdBy: user,
    kind: spec.kind,
    spec,
    document: doc,
    progress: { fraction: 0, done: 0, total: 0 },
  });
  await em.flush();
  await queue.send(study.id, limits.budgetSeconds);
  return study;
}

export async function findStudy(em: EntityManager, chain: Chain, id: string): Promise<Study> {
  const study = await em.findOne(StudySchema, { id, chain: chain.id }, { populate: ['createdBy'] });
  if (!study) throw new NotFoundError('no such study of this chain');
  return study;
}

/**
 * Cancels a study: a queued one at once; a running one by a request its worker acts on
 * within its next tick (well under a second).
 */
export async function cancelStudy(em: EntityManager, study: Study): Promise<Study> {
  if (study.status === 'done' || study.status === 'failed' || study.status === 'cancelled') {
    throw new ConflictError(
      'study-finished',
      `this study has already ${study.status === 'done' ? 'finished' : study.status}`,
    );
  }
  // A queued study ends here; a running one (or one a worker claims meanwhile) gets the
  // request, which its worker reads within a tick.
  await em.nativeUpdate(
    StudySchema,
    { id: study.id, status: 'queued' },
    {
      status: 'cancelled',
      cancelRequested: true,
      finishedAt: new Date(),
      error: 'cancelled by a user',
    },
  );
  await em.nativeUpdate(
    StudySchema,
    { id: study.id, status: 'running' },
    { cancelRequested: true },
  );
  await em.refresh(study);
  return study;
}
