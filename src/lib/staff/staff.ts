import { z } from 'zod';
import { staffClinic } from '../auth/access';
import { auditAs, type RequestContext } from '../auth/context';
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
  const clinic = staffClinic(ctx.viewer, ['admin'], clinicId);
  const rows = await ctx.knex('memberships as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.clinic_id', clinic)
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
  const clinic = staffClinic(ctx.viewer, ['admin'], input.clinicId);
  const member = /^[0-9a-f-]{36}$/i.test(userId)
    ? await ctx.knex('memberships').where({ user_id: userId, clinic_id: clinic }).first()
    : undefined;
  if (!member) throw notFound('That staff member');
  if (userId === ctx.viewer.userId) throw badRequest('You cannot change your own role or disable your own account; ask another administrator.');
  await ctx.knex.transaction(async (trx) => {
    if (input.role) await trx('memberships').where({ id: member.id }).update({ role: input.role });
    if (input.disabled !== undefined) {
      await trx('users').where({ id: userId }).update({ disabled_at: input.disabled ? trx.fn.now() : null, updated_at: trx.fn.now() });
      if (input.disabled) await revokeUserSessions(trx, userId);
    }
    await auditAs(ctx, { action: 'staff.update', clinicId: clinic, recordType: 'user', recordId: userId, detail: { role: input.role, disabled: input.disabled } }, trx);
  });
  return (await listStaff(ctx, clinic)).find((s) => s.userId === userId)!;
}
