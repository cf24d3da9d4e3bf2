// Scan upload, stored grids, detection on stored scans and versioned marks, against the built
// app. Inputs are synthetic topographs made with a fixed seed (invented data, test input only).
import { PNG } from 'pngjs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { decodeFloat32Grid } from '../../shared/scan/gridfile'
import { syntheticScan } from '../../shared/scan/synthetic'
import { startApp, type RunningApp } from '../helpers/app'
import { Client, linkIn, waitForMail } from '../helpers/client'

let app: RunningApp
let owner: Client
let viewer: Client
let labId: number
let sampleId: number
const scan = syntheticScan({ width: 128, height: 96, pixel_nm: 0.1, density_per_nm2: 0.25, margin_nm: 1, fwhm_nm: 0.8, height_nm: 0.1, noise_nm: 0.002, seed: 7 })
const csv = Array.from({ length: scan.height }, (_, r) => Array.from(scan.data.subarray(r * scan.width, (r + 1) * scan.width), v => v.toPrecision(9)).join(',')).join('\n')
const frame = { size_x_nm: 12.8, size_y_nm: 9.6, bias_V: -0.1, setpoint_A: 1e-10 }

function png16(width: number, height: number, value: (i: number) => number): Buffer {
  const png = new PNG({ width, height, bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false })
  const data = new Uint16Array(width * height)
  for (let i = 0; i < data.length; i++) data[i] = value(i)
  png.data = Buffer.from(data.buffer)
  return PNG.sync.write(png, { bitDepth: 16, colorType: 0, inputColorType: 0, inputHasAlpha: false })
}

beforeAll(async () => {
  app = await startApp()
  owner = new Client(app.url)
  await owner.register('scanner@lab.test')
  labId = (await owner.post('/api/labs', { name: 'Scan lab' })).body.id
  sampleId = (await owner.post(`/api/labs/${labId}/samples`, { name: 'S', surface: 'Ag(111)', adsorbate: 'Co', temperature_K: 5 })).body.id
  await owner.post(`/api/labs/${labId}/invites`, { email: 'look@lab.test', role: 'viewer' })
  const mail = await waitForMail(app.url, m => m.to.includes('look@lab.test'))
  viewer = new Client(app.url)
  await viewer.register('look@lab.test')
  await viewer.post(`/api/invites/${linkIn(mail.text, '/invite').split('/invite/')[1]}/accept`)
})
afterAll(async () => {
  await app?.stop()
})

const uploadPath = () => `/api/labs/${labId}/samples/${sampleId}/scans`

describe('scan upload', () => {
  it('stores a CSV grid, keeps the original, serves the Float32 grid, detects every adatom', async () => {
    const res = await owner.upload(uploadPath(), { name: 'terrace.csv', data: `# synthetic test grid\n${csv}` }, frame)
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ width_px: 128, height_px: 96, size_x_nm: 12.8, bias_V: -0.1 })
    const id = res.body.id
    const original = await owner.request('GET', `/api/scans/${id}/file`)
    expect(original.body.startsWith('# synthetic test grid')).toBe(true)
    const gridRes = await fetch(`${app.url}/api/scans/${id}/grid`)
    expect(gridRes.status).toBe(401)
    const detect = await owner.post(`/api/scans/${id}/detect`, { fwhm_nm: 0.8 })
    expect(detect.status).toBe(200)
    expect(detect.body.version).toBe(1)
    // Every synthetic adatom found within one pixel (0.1 nm), nothing else, and on average far
    // better (the sub-pixel accuracy itself is checked in tests/unit/scan).
    expect(detect.body.marks).toHaveLength(scan.atoms.length)
    const errors = scan.atoms.map(a => Math.min(...detect.body.marks.map((m: { x_nm: number, y_nm: number }) => Math.hypot(m.x_nm - a.x_nm, m.y_nm - a.y_nm))))
    expect(Math.max(...errors)).toBeLessThan(0.1)
    expect(errors.reduce((s, e) => s + e, 0) / errors.length).toBeLessThan(0.02)
  })

  it('reads back a 16-bit PNG exactly with its height scale applied', async () => {
    const bytes = png16(64, 32, i => (i * 37) % 65536)
    const res = await owner.upload(uploadPath(), { name: 'topo.png', data: bytes, type: 'image/png' }, { ...frame, nm_per_level: 0.0001 })
    expect(res.status).toBe(201)
    const raw = await owner.request('GET', `/api/scans/${res.body.id}/grid`)
    expect(raw.status).toBe(200)
    const buf = await (await fetch(`${app.url}/api/scans/${res.body.id}/grid`, { headers: { cookie: cookieOf(owner) } })).arrayBuffer()
    const grid = decodeFloat32Grid(new Uint8Array(buf))
    expect([grid.width, grid.height]).toEqual([64, 32])
    for (const i of [0, 1, 777, 2047]) expect(grid.data[i]).toBe(Math.fround(((i * 37) % 65536) * 0.0001))
  })

  it('refuses bad input with the problem named and stores nothing', async () => {
    const before = (await owner.get(`/api/labs/${labId}/scans?sample=${sampleId}`)).body.length
    const cases: [{ name: string, data: Uint8Array | string }, Record<string, string | number>, RegExp][] = [
      [{ name: 'fake.png', data: 'hello, not an image' }, frame, /is not a PNG/],
      [{ name: 'empty.csv', data: '' }, frame, /empty/],
      [{ name: 'ragged.csv', data: '1,2,3\n4,5\n' }, frame, /row 2/i],
      [{ name: 'nan.csv', data: '1,2\n3,NaN\n' }, frame, /row 2/i],
      [{ name: 'ok.csv', data: '1,2\n3,4\n' }, { ...frame, size_x_nm: 0 }, /size_x_nm/],
      [{ name: 'ok.csv', data: '1,2\n3,4\n' }, { ...frame, size_y_nm: -5 }, /size_y_nm/],
      [{ name: 'huge.png', data: hugePngHeader() }, { ...frame, nm_per_level: 1e-4 }, /8192|too large|exceeds/i],
      [{ name: 'grey.png', data: png16(4, 4, () => 5) }, frame, /nm_per_level|z_range_nm/],
    ]
    for (const [file, fields, message] of cases) {
      const res = await owner.upload(uploadPath(), file, fields)
      expect(res.status, file.name).toBe(400)
      expect(res.body.message, file.name).toMatch(message)
    }
    expect((await owner.get(`/api/labs/${labId}/scans?sample=${sampleId}`)).body.length).toBe(before)
  })

  it('keeps viewers from uploading and from editing marks', async () => {
    expect((await viewer.upload(uploadPath(), { name: 'v.csv', data: '1,2\n3,4\n' }, frame)).status).toBe(403)
    const list = await viewer.get(`/api/labs/${labId}/scans?sample=${sampleId}`)
    expect(list.status).toBe(200)
    const id = list.body[0].id
    expect((await viewer.post(`/api/scans/${id}/marks`, { marks: [], base_version: 0 })).status).toBe(403)
    expect((await viewer.post(`/api/scans/${id}/detect`, {})).status).toBe(403)
    expect((await viewer.get(`/api/scans/${id}/marks`)).status).toBe(200)
  })
})

describe('marks versions', () => {
  it('saves edits as new versions and refuses a stale base version', async () => {
    const res = await owner.upload(uploadPath(), { name: 'small.csv', data: '0,0,0\n0,1,0\n0,0,0\n' }, { size_x_nm: 3, size_y_nm: 3 })
    const id = res.body.id
    const first = await owner.post(`/api/scans/${id}/marks`, { marks: [{ x_nm: 1.5, y_nm: 1.5 }], base_version: 0 })
    expect(first.body).toEqual({ version: 1, count: 1 })
    const second = await owner.post(`/api/scans/${id}/marks`, { marks: [{ x_nm: 1.6, y_nm: 1.4, species: 'Co' }], base_version: 1 })
    expect(second.body.version).toBe(2)
    const stale = await owner.post(`/api/scans/${id}/marks`, { marks: [], base_version: 1 })
    expect(stale.status).toBe(409)
    const latest = await owner.get(`/api/scans/${id}/marks`)
    expect(latest.body.marks).toEqual([{ x_nm: 1.6, y_nm: 1.4, height_nm: 0, score: 0, species: 'Co' }])
    // Nothing saved is lost: version 1 is still there.
    expect((await owner.get(`/api/scans/${id}/marks?version=1`)).body.marks[0].x_nm).toBe(1.5)
    const bad = await owner.post(`/api/scans/${id}/marks`, { marks: [{ x_nm: 'a', y_nm: 1 }], base_version: 2 })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('marks.0.x_nm')
  })
})

describe('POST /api/compute/detect', () => {
  it('follows the contract: pixel centres at (c + ½)·px', async () => {
    const small = syntheticScan({ width: 40, height: 30, pixel_nm: [0.1, 0.2], atoms: [{ x_nm: 2.05, y_nm: 3.1, height_nm: 0.1 }], fwhm_nm: 0.8, noise_nm: 0, seed: 3 })
    const res = await owner.post('/api/compute/detect', { width: 40, height: 30, data: Array.from(small.data), pixel_nm: [0.1, 0.2], fwhm_nm: 0.8 })
    expect(res.status).toBe(200)
    expect(res.body.marks).toHaveLength(1)
    expect(res.body.marks[0].x_nm).toBeCloseTo(2.05, 2)
    expect(res.body.marks[0].y_nm).toBeCloseTo(3.1, 2)
    const bad = await owner.post('/api/compute/detect', { width: 2, height: 2, data: [1, 2, 3], pixel_nm: 0.1 })
    expect(bad.status).toBe(400)
  })
})

function cookieOf(c: Client): string {
  return [...(c as unknown as { cookies: Map<string, string> }).cookies].map(([k, v]) => `${k}=${v}`).join('; ')
}

// A PNG whose header claims 100 000 × 100 000 pixels (valid CRC), followed by nothing: must be
// refused from the header, before any pixel buffer is allocated.
function hugePngHeader(): Uint8Array {
  const sig = [137, 80, 78, 71, 13, 10, 26, 10]
  const ihdr = new Uint8Array(13)
  const dv = new DataView(ihdr.buffer)
  dv.setUint32(0, 100_000)
  dv.setUint32(4, 100_000)
  ihdr.set([16, 0, 0, 0, 0], 8)
  const type = new TextEncoder().encode('IHDR')
  const crcInput = new Uint8Array([...type, ...ihdr])
  const len = new Uint8Array(4)
  new DataView(len.buffer).setUint32(0, 13)
  const crc = new Uint8Array(4)
  new DataView(crc.buffer).setUint32(0, crc32(crcInput))
  return new Uint8Array([...sig, ...len, ...crcInput, ...crc])
}

function crc32(bytes: Uint8Array): number {
  // CRC-32 as specified for PNG chunks (ISO/IEC 15948 Annex D; polynomial 0xEDB88320).
  let c = 0xFFFFFFFF
  for (const b of bytes) {
    c ^= b
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xEDB88320 ^ (c >>> 1) : c >>> 1
  }
  return (c ^ 0xFFFFFFFF) >>> 0
}
