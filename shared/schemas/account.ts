// Input rules for accounts, labs, members and samples, shared by the forms and the API.
import { z } from 'zod'
import { ROLE_ORDER } from '../roles'

export const Email = z.string({ error: 'an e-mail address is required' }).trim().toLowerCase()
  .max(254, 'too long').pipe(z.email({ error: 'not a valid e-mail address' }))
export const Password = z.string({ error: 'a password is required' })
  .min(10, 'use at least 10 characters').max(200, 'at most 200 characters')
const Name = z.string({ error: 'a name is required' }).trim().min(1, 'a name is required').max(120, 'at most 120 characters')

export const RegisterInput = z.object({ email: Email, password: Password, name: Name })
export const LoginInput = z.object({ email: Email, password: z.string({ error: 'a password is required' }).min(1, 'a password is required').max(200) })
export const ForgotInput = z.object({ email: Email })
export const ResetInput = z.object({ token: z.string().min(20, 'this link is incomplete').max(200), password: Password })

export const Role = z.enum(ROLE_ORDER, { error: 'role must be owner, member or viewer' })
export const LabInput = z.object({ name: Name })
export const InviteInput = z.object({ email: Email, role: Role.default('member') })
export const RoleChangeInput = z.object({ role: Role })

// Surfaces are written Element(hkl), e.g. "Ag(111)"; the lattice library lists the ones with
// handbook constants, and a custom lattice can be entered for anything else.
export const SurfaceName = z.string({ error: 'a surface is required' }).trim()
  .regex(/^[A-Z][a-z]?\((\d{3}|custom)\)$/, 'write the surface as Element(hkl), e.g. Ag(111)')

export const SampleInput = z.object({
  name: Name,
  surface: SurfaceName,
  adsorbate: z.string({ error: 'an adsorbate is required' }).trim().min(1, 'an adsorbate is required').max(60, 'at most 60 characters'),
  temperature_K: z.number({ error: 'temperature_K must be a number' }).finite().gt(0, 'must be above 0 K').max(1000, 'at most 1000 K'),
  notes: z.string().max(5000, 'at most 5000 characters').optional(),
})
// The sample's surface state for the wave preview (band bottom E0 vs E_F, m*/m_e, where from);
// null clears it. Bounds as in shared/waves/schema.ts.
export const SurfaceStateInput = z.object({
  E0_eV: z.number({ error: 'E0_eV must be a number' }).finite().min(-5, 'must be ≥ −5 eV').max(5, 'must be ≤ 5 eV'),
  m_eff: z.number({ error: 'm_eff must be a number' }).finite().gt(0, 'must be > 0 (in units of the electron mass)').max(10, 'must be ≤ 10'),
  source: z.string().trim().max(300, 'at most 300 characters').optional(),
})
export const SamplePatch = SampleInput.partial().extend({ archived: z.boolean().optional(), surface_state: SurfaceStateInput.nullable().optional() })

export type RegisterInput = z.infer<typeof RegisterInput>
export type SampleInput = z.infer<typeof SampleInput>
