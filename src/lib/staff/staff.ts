import { z } from 'zod';
import type { RequestContext } from '../auth/context';
import { scope } from '../data';
import { revokeUserSessions } from '../auth/sessions';
import { badRequest, notFound } from '../http/errors';

export const staffUpdateSchema = z
  .object({
    role: z.enum(['admin', 'therapist']).optional(),
    disabled: z.boolean().optional(),
    clinicId: z.string().uuid().optional(),
  })
  .refine((v) => v.role !== undefined || v.disabled !== undefined, { message: 'Change the role or the disabled state.' });

export async function listStaff(ctx: RequestContext, clinicId?: string) {
  const clinic = scope(ctx).clinic(['admin'], clinicId);
  const rows = await clinic.db('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .orderBy('u.name')
    .select('u.id', 'u.name', 'u.email', 'u.disabled_at', 'm.role', 'm.created_at');
  return rows.map((r) => ({
    userId: r.id,
    name: r.name,
    email: r.email,
    role: r.role,
    disabled: r.disabled_at !== null,
    since: r.created_at.toISOString(),
  }));
}

/** Changes a colleague's role or disables the account; disabling ends their sessions at once. */
export async function updateStaff(ctx: RequestContext, userId: string, input: z.infer<typeof staffUpdateSchema>) {
  const clinic = scope(ctx).clinic(['admin'], input.clinicId);
  const member = /^[0-9a-f-]{36}$/i.test(userId) ? await clinic.db('memberships').where({ user_id: userId }).first() : undefined;
  if (!member) throw notFound('That staff member');
  if (userId === ctx.viewer.userId) throw badRequest('You cannot change your own role or disable your own account; ask another administrator.');
  await clinic.transaction(async (tx) => {
    if (input.role) await tx.db('memberships').where({ id: member.id }).update({ role: input.role });
    if (input.disabled !== undefined) {
      await tx.db('users').where({ id: userId }).update({ disabled_at: input.disabled ? tx.db.fn.now() : null, updated_at: tx.db.fn.now() });
      if (input.disabled) await revokeUserSessions(tx.system('a disabled account’s sessions end'), userId);
    }
    await tx.audit({ action: 'staff.update', recordType: 'user', recordId: userId, detail: { role: input.role, disabled: input.disabled } });
  });
  return (await listStaff(ctx, clinic.id)).find((s) => s.userId === userId)!;
}
