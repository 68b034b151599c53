import { Router, type Response } from 'express';
import { commentSchema, editCommentSchema, type CommentDto } from '../../shared/schema/api';
import { recordActivity } from '../activity/record';
import { ForbiddenError, NotFoundError, ValidationError } from '../common/errors';
import { access, chainRole, currentUser, loadedChain, uuidParam } from '../common/roles';
import type { Services } from '../common/services';
import { parseOr422 } from '../common/validate';
import { publicBaseUrl } from '../config';
import { messages } from '../mail/messages';
import { publishChainEvent } from '../presence/event-hub';
import { MembershipSchema } from '../workspaces/membership.entity';
import { CommentSchema, type Comment } from './comment.entity';
import { mentionedAddresses } from './mentions';

function toCommentDto(c: Comment): CommentDto {
  return {
    id: c.id,
    chainId: c.chain.id,
    stageId: c.stageId ?? null,
    body: c.body,
    authorId: c.author.id,
    author: c.author.displayName,
    createdAt: c.createdAt.toISOString(),
    editedAt: c.editedAt?.toISOString() ?? null,
  };
}

/**
 * /api/chains/:id/comments: every member reads and writes (viewers too); authors edit and
 * delete their own; owners delete any. Other open editors hear of changes at once.
 */
export function commentsRouter(services: Services): Router {
  const router = Router();
  const { em } = services;

  const findComment = async (res: Response, cid: string) => {
    const comment = await em.findOne(
      CommentSchema,
      { id: cid, chain: loadedChain(res).id },
      { populate: ['author'] },
    );
    if (!comment) throw new NotFoundError('this chain has no such comment');
    return comment;
  };

  const announce = (chainId: string, by: string) =>
    publishChainEvent(em, { type: 'comments', chainId, by });

  router.get('/:id/comments', chainRole(em, 'viewer'), async (_req, res) => {
    const comments = await em.find(
      CommentSchema,
      { chain: loadedChain(res).id },
      { populate: ['author'], orderBy: { createdAt: 'asc' } },
    );
    res.json(comments.map(toCommentDto));
  });

  router.post('/:id/comments', chainRole(em, 'viewer'), async (req, res) => {
    const body = parseOr422(commentSchema, req.body);
    const chain = loadedChain(res);
    const author = currentUser(req);
    const stage = body.stageId ? chain.document.stages.find((s) => s.id === body.stageId) : null;
    if (body.stageId && !stage) {
      throw new ValidationError('this chain has no stage with that id (was it removed?)', [
        { path: 'stageId', message: 'no such stage in the saved chain' },
      ]);
    }
    const comment = em.create(CommentSchema, {
      chain,
      stageId: body.stageId ?? null,
      author,
      body: body.body,
    });
    const where = stage ? `stage "${stage.label || stage.type}"` : 'the chain';
    recordActivity(em, {
      workspaceId: chain.workspace.id,
      actor: author,
      kind: 'comment-added',
      summary: `commented on ${where} of "${chain.name}"`,
      chainId: chain.id,
    });
    await em.flush();
    await announce(chain.id, author.displayName);

    // Mentions tell members by mail; addresses outside the workspace are not written to.
    const addresses = mentionedAddresses(body.body).filter((a) => a !== author.email);
    const members = addresses.length
      ? await em.find(
          MembershipSchema,
          { workspace: chain.workspace.id, user: { email: { $in: addresses } } },
          { populate: ['user'] },
        )
      : [];
    const url = `${publicBaseUrl(services.config)}/w/${chain.workspace.id}/chains/${chain.id}${stage ? `?stage=${encodeURIComponent(stage.id)}` : ''}`;
    const mailProblems: string[] = [];
    for (const m of members) {
      const outcome = await services.mail.send(
        em,
        messages.mention(m.user.email, {
          by: author.displayName,
          chain: chain.name,
          where,
          body: body.body,
          url,
        }),
      );
      if (!outcome.sent && outcome.message) mailProblems.push(outcome.message);
    }
    const answer: CommentDto = {
      ...toCommentDto(comment),
      notified: members.map((m) => m.user.email),
      ...(mailProblems.length ? { mailProblems } : {}),
    };
    res.status(201).json(answer);
  });

  router.patch('/:id/comments/:cid', chainRole(em, 'viewer'), async (req, res) => {
    const body = parseOr422(editCommentSchema, req.body);
    const comment = await findComment(res, uuidParam(req, 'cid', 'comment'));
    if (comment.author.id !== currentUser(req).id) {
      throw new ForbiddenError('only its author may edit a comment', 'not-author');
    }
    comment.body = body.body;
    comment.editedAt = new Date();
    await em.flush();
    await announce(comment.chain.id, currentUser(req).displayName);
    res.json(toCommentDto(comment));
  });

  router.delete('/:id/comments/:cid', chainRole(em, 'viewer'), async (req, res) => {
    const comment = await findComment(res, uuidParam(req, 'cid', 'comment'));
    if (comment.author.id !== currentUser(req).id && access(res).role !== 'owner') {
      throw new ForbiddenError(
        'only its author or a workspace owner may delete a comment',
        'not-author',
      );
    }
    await em.remove(comment).flush();
    await announce(loadedChain(res).id, currentUser(req).displayName);
    res.status(204).end();
  });

  return router;
}
