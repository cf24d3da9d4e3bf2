// Plane vector arithmetic for lattice work: positions are [x, y] in nm, angles in degrees at the API.
export type Vec2 = [number, number]

export const DEG = Math.PI / 180

export function add(a: Vec2, b: Vec2): Vec2 {
  return [a[0] + b[0], a[1] + b[1]]
}
export function sub(a: Vec2, b: Vec2): Vec2 {
  return [a[0] - b[0], a[1] - b[1]]
}
export function scale(a: Vec2, s: number): Vec2 {
  return [a[0] * s, a[1] * s]
}
export function dot(a: Vec2, b: Vec2): number {
  return a[0] * b[0] + a[1] * b[1]
}
export function cross(a: Vec2, b: Vec2): number {
  return a[0] * b[1] - a[1] * b[0]
}
export function norm(a: Vec2): number {
  return Math.hypot(a[0], a[1])
}
export function dist(a: Vec2, b: Vec2): number {
  return Math.hypot(a[0] - b[0], a[1] - b[1])
}

export function rotate(a: Vec2, angle_deg: number): Vec2 {
  const c = Math.cos(angle_deg * DEG)
  const s = Math.sin(angle_deg * DEG)
  return [c * a[0] - s * a[1], s * a[0] + c * a[1]]
}

export function rotateAbout(p: Vec2, pivot: Vec2, angle_deg: number): Vec2 {
  return add(pivot, rotate(sub(p, pivot), angle_deg))
}

/** Angle of a vector in degrees, (−180, 180]. */
export function angleDeg(a: Vec2): number {
  return Math.atan2(a[1], a[0]) / DEG
}

/** Wrap an angle into (−period/2, period/2]. */
export function wrapAngle(angle_deg: number, period_deg: number): number {
  let w = angle_deg - period_deg * Math.round(angle_deg / period_deg)
  if (w <= -period_deg / 2) w += period_deg
  return w
}

export function isFiniteVec(v: unknown): v is Vec2 {
  return Array.isArray(v) && v.length === 2 && Number.isFinite(v[0]) && Number.isFinite(v[1])
}
