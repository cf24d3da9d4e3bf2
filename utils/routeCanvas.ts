// Canvas drawing pieces of the route layer, in world nm with sizes divided by the zoom s.

export function routePolyline(c: CanvasRenderingContext2D, path: readonly number[][]) {
  c.moveTo(path[0]![0]!, path[0]![1]!)
  for (let k = 1; k < path.length; k++) c.lineTo(path[k]![0]!, path[k]![1]!)
}
export function routeArrowHead(c: CanvasRenderingContext2D, path: readonly number[][], size: number) {
  const b = path[path.length - 1]!, a = path[path.length - 2]
  if (!a) return
  const ang = Math.atan2(b[1]! - a[1]!, b[0]! - a[0]!)
  c.moveTo(b[0]!, b[1]!)
  c.lineTo(b[0]! - size * Math.cos(ang - 0.45), b[1]! - size * Math.sin(ang - 0.45))
  c.lineTo(b[0]! - size * Math.cos(ang + 0.45), b[1]! - size * Math.sin(ang + 0.45))
  c.closePath()
}

export interface RouteOptionsPicture {
  keepOut: readonly number[][][]
  locked: Set<number>
  excluded: Set<number>
  drawing: readonly number[][]
  cursor: { x_nm: number, y_nm: number } | null
  marks: readonly { id: number, x_nm: number, y_nm: number }[]
}

/** Keep-out polygons (with the one being drawn, up to the cursor) and locked / excluded marks. */
export function drawRouteOptions(c: CanvasRenderingContext2D, s: number, o: RouteOptionsPicture) {
  const { keepOut, locked, excluded } = o
  c.lineWidth = 1.5 / s
  c.setLineDash([5 / s, 4 / s])
  c.strokeStyle = '#ec6862'
  c.fillStyle = 'rgba(236, 104, 98, 0.12)'
  for (const poly of keepOut) {
    c.beginPath()
    routePolyline(c, poly)
    c.closePath()
    c.fill()
    c.stroke()
  }
  c.setLineDash([])
  const d = o.drawing
  if (d.length) {
    c.strokeStyle = '#f0a04b'
    c.beginPath()
    routePolyline(c, d)
    if (o.cursor) c.lineTo(o.cursor.x_nm, o.cursor.y_nm)
    c.stroke()
    c.fillStyle = '#f0a04b'
    for (const p of d) c.fillRect(p[0]! - 2.5 / s, p[1]! - 2.5 / s, 5 / s, 5 / s)
  }
  if (!locked.size && !excluded.size) return
  const r = 7 / s
  c.lineWidth = 2 / s
  for (const m of o.marks) {
    if (locked.has(m.id)) {
      c.strokeStyle = '#70b0e8'
      c.strokeRect(m.x_nm - r, m.y_nm - r, 2 * r, 2 * r)
    }
    else if (excluded.has(m.id)) {
      c.strokeStyle = '#8794a5'
      c.beginPath()
      c.moveTo(m.x_nm - r, m.y_nm - r)
      c.lineTo(m.x_nm + r, m.y_nm + r)
      c.moveTo(m.x_nm + r, m.y_nm - r)
      c.lineTo(m.x_nm - r, m.y_nm + r)
      c.stroke()
    }
  }
}
