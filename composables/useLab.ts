import { roleAllows } from '#shared/roles'

/** The lab of the current route, with what the signed-in user's role allows. */
export function useLab() {
  const route = useRoute()
  const labId = computed(() => Number(route.params.labId))
  const { data: lab, error, refresh } = useFetch(() => `/api/labs/${labId.value}`, { key: computed(() => `lab-${labId.value}`) })
  const canEdit = computed(() => !!lab.value && roleAllows(lab.value.role, 'member'))
  const isOwner = computed(() => lab.value?.role === 'owner')
  return { labId, lab, error, refresh, canEdit, isOwner }
}
