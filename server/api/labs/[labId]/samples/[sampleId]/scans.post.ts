import { randomUUID } from 'node:crypto'
import { decodeScan } from '#shared/scan/decode'
import { encodeFloat32Grid } from '#shared/scan/gridfile'
import { toHeights, type HeightScale } from '#shared/scan/heights'
import { ScanFrameInput } from '#shared/schemas/scan'

// Upload a scan: the file is sniffed by its magic bytes and decoded (nothing is stored unless it
// decodes and its frame is valid), then the original is kept as uploaded and the height grid in
// nm is stored as Float32 beside it for fast reloads.
export default defineEventHandler(async (event) => {
  const access = await requireLabRole(event, idParam(event, 'labId'), 'member')
  const sampleId = idParam(event, 'sampleId')
  const db = await useDb()
  const sample = await sampleInLab(db, access.labId, sampleId)
  const upload = await readUpload(event)
  const parsed = ScanFrameInput.safeParse(upload.fields)
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!
    const field = issue.path.join('.') || 'frame'
    throw createError({ statusCode: 400, message: `${field}: ${issue.message}`, data: { field, issues: parsed.error.issues.map(i => ({ field: i.path.join('.'), message: i.message })) } })
  }
  const frame = parsed.data
  if (frame.build_id !== undefined) await buildInLab(db, access.labId, frame.build_id)

  const { raw, heights } = await compute400(() => {
    const raw = decodeScan(new Uint8Array(upload.data.buffer, upload.data.byteOffset, upload.data.byteLength), { filename: upload.filename })
    const scale: HeightScale = frame.nm_per_level !== undefined
      ? { nm_per_level: frame.nm_per_level }
      : frame.z_range_nm !== undefined ? { z_range_nm: frame.z_range_nm } : { factor: frame.height_factor }
    return { raw, heights: toHeights(raw, raw.valueUnit === 'nm' ? { factor: frame.height_factor } : scale) }
  })

  const base = `${access.labId}:${sample.id}:${randomUUID()}`
  const storage = useStorage('scans')
  await storage.setItemRaw(`${base}:original`, upload.data)
  await storage.setItemRaw(`${base}:grid`, Buffer.from(encodeFloat32Grid(heights)))
  const [scan] = await db.insert(schema.scans).values({
    lab_id: access.labId, sample_id: sample.id, build_id: frame.build_id ?? null, purpose: frame.purpose ?? 'plan',
    filename: upload.filename || 'scan', format: `${raw.format}-${raw.sampleType}${raw.bitDepth}`,
    storage_key: `${base}:original`, grid_key: `${base}:grid`, bytes: upload.data.length,
    width_px: raw.width, height_px: raw.height, size_x_nm: frame.size_x_nm, size_y_nm: frame.size_y_nm,
    offset_x_nm: frame.offset_x_nm ?? 0, offset_y_nm: frame.offset_y_nm ?? 0, rotation_deg: frame.rotation_deg ?? 0,
    bias_V: frame.bias_V ?? null, setpoint_A: frame.setpoint_A ?? null,
    z_scale: { ...(frame.nm_per_level !== undefined && { nm_per_level: frame.nm_per_level }), ...(frame.z_range_nm !== undefined && { z_range_nm: frame.z_range_nm }), ...(frame.height_factor !== undefined && { factor: frame.height_factor }) },
    taken_at: frame.taken_at ? new Date(frame.taken_at) : null, notes: frame.notes ?? '', created_by: access.userId,
  }).returning()
  await audit(db, { labId: access.labId, userId: access.userId, action: 'scan.upload', target: `scan:${scan!.id}`, detail: { filename: upload.filename, bytes: upload.data.length } })
  setResponseStatus(event, 201)
  return publicScan(scan!)
})
