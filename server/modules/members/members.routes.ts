import { Router } from 'express';
import { MemberListSchema, MemberSchema, UpdateMemberInputSchema, UuidSchema } from '#shared/schemas/accounts.ts';
import { AppError } from '../../http/problem.ts';
import { parseJsonBody } from '../../http/validate.ts';
import type { AccountsDeps } from '../auth/auth.types.ts';
import { requestMeta } from '../auth/request-meta.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import { listMembers } from './members.queries.ts';
import { changeMemberRole, removeMember, toMember } from './members.service.ts';

/** A path id that is not a UUID names nothing: 404 like any unknown id. */
function memberId(raw: string | string[] | undefined): string {
  const parsed = UuidSchema.safeParse(raw);
  if (!parsed.success) throw new AppError('not-found', 'No member with this id in your organization.');
  return parsed.data;
}

/** /members: the active organization's people and their roles. */
export function membersRouter({ db }: AccountsDeps) {
  const router = Router();

  router.get('/members', requireRole('owner', 'admin', 'developer', 'viewer'), async (_req, res) => {
    const rows = await listMembers(db, organizationAuth(res).organizationId);
    res.json(MemberListSchema.parse({ members: rows.map(toMember) }));
  });

  router.patch('/members/:userId', requireRole('owner', 'admin'), async (req, res) => {
    const auth = organizationAuth(res);
    const userId = memberId(req.params.userId);
    const { role } = parseJsonBody(UpdateMemberInputSchema, req);
    const member = await db.transaction((tx) => changeMemberRole(tx, auth, userId, role, requestMeta(req)));
    res.json(MemberSchema.parse(member));
  });

  // Owners and admins remove others; anyone (but the owner) may remove themselves, i.e. leave.
  router.delete('/members/:userId', requireRole('owner', 'admin', 'developer', 'viewer'), async (req, res) => {
    const auth = organizationAuth(res);
    const userId = memberId(req.params.userId);
    await db.transaction((tx) => removeMember(tx, auth, userId, requestMeta(req)));
    res.status(204).end();
  });

  return router;
}
