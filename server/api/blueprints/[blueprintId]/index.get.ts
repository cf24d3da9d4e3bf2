// One version of a blueprint with its expanded sites (ideal frame) and the list of versions.
export default defineEventHandler(async (event) => {
  const { db, blueprint } = await blueprintForCaller(event, 'viewer')
  const expanded = await compute400(() => expandRow(blueprint))
  return { blueprint, sites: expanded.sites, per_shape: expanded.perShape, max_deviation_nm: expanded.maxDeviation_nm, versions: await versionsOf(db, blueprint.lineage) }
})
