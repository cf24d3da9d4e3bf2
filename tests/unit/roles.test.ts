// The role order behind the one server guard (common practice for lab tools: owner ⊃ member ⊃
// viewer), and the shared input rules that forms and API both apply.
import { describe, expect, it } from 'vitest'
import { roleAllows, ROLE_ORDER } from '../../shared/roles'
import { InviteInput, RegisterInput, SampleInput } from '../../shared/schemas/account'
import { withLabDefaults } from '../../shared/schemas/lab'

describe('roleAllows', () => {
  it('grants each role exactly the roles at or below it', () => {
    const table: Record<string, string[]> = { viewer: ['viewer'], member: ['viewer', 'member'], owner: ['viewer', 'member', 'owner'] }
    for (const actual of ROLE_ORDER) {
      for (const needed of ROLE_ORDER) expect(roleAllows(actual, needed)).toBe(table[actual]!.includes(needed))
    }
  })
})

describe('input rules', () => {
  it('normalises e-mail and names the failing field', () => {
    const ok = RegisterInput.parse({ email: '  Ada@Lab.Test ', password: 'long enough!', name: ' Ada ' })
    expect(ok).toEqual({ email: 'ada@lab.test', password: 'long enough!', name: 'Ada' })
    const bad = RegisterInput.safeParse({ email: 'ada', password: 'x', name: '' })
    expect(bad.success).toBe(false)
    expect(bad.error!.issues.map(i => i.path[0]).sort()).toEqual(['email', 'name', 'password'])
  })

  it('accepts surfaces written Element(hkl) and physical temperatures only', () => {
    const base = { name: 'S', surface: 'Cu(111)', adsorbate: 'Fe', temperature_K: 4.3 }
    expect(SampleInput.safeParse(base).success).toBe(true)
    for (const surface of ['Cu111', 'copper', 'Cu(11)', '']) expect(SampleInput.safeParse({ ...base, surface }).success).toBe(false)
    for (const temperature_K of [0, -1, Number.NaN, Infinity, '5']) expect(SampleInput.safeParse({ ...base, temperature_K }).success).toBe(false)
  })

  it('defaults an invitation to member and refuses unknown roles', () => {
    expect(InviteInput.parse({ email: 'a@b.test' }).role).toBe('member')
    expect(InviteInput.safeParse({ email: 'a@b.test', role: 'admin' }).success).toBe(false)
  })

  it('fills lab settings with defaults and ignores nonsense stored values', () => {
    expect(withLabDefaults({ tip_speed_nm_s: 5 }).tip_speed_nm_s).toBe(5)
    expect(withLabDefaults({ tip_speed_nm_s: -1 }).tip_speed_nm_s).toBe(2)
    expect(withLabDefaults(null).check_every_moves).toBe(10)
  })
})
