/** What was coated, for whom, with what and to which spec; plus preparation and climate. */
import type { CertificateData } from '../../../shared/api/certificates'
import { formatDate } from '../format'
import type { Field, Sheet } from '../layout'
import { SPACE } from '../theme'

const NOT_APPLICABLE = 'Not applicable'

function section(sheet: Sheet, title: string, fields: Field[], columns: number): void {
  // The heading keeps the whole grid with it: these grids are a few lines tall.
  sheet.heading(title, sheet.gridHeight(fields, columns))
  sheet.grid(fields, columns)
  sheet.gap(SPACE.sectionGapPt - SPACE.rowGapPt)
}

export function drawCustomerAndLot(sheet: Sheet, data: CertificateData): void {
  section(
    sheet,
    'Customer and production',
    [
      { label: 'Customer', value: `${data.customer.name}\n${data.customer.address}`, span: 2 },
      { label: 'Coating line', value: data.line },
      { label: 'Shift', value: data.shift },
    ],
    4,
  )
}

export function drawCoatingAndSpec(sheet: Sheet, data: CertificateData): void {
  const { coating, spec } = data
  section(
    sheet,
    'Coating and specification',
    [
      { label: 'Coating material', value: coating.material, span: 2, strong: true },
      { label: 'Batch', value: coating.batchNumber },
      { label: 'Batch use-by date', value: formatDate(coating.batchExpiresOn) },
      { label: 'Specification', value: `${spec.code} — ${spec.title}`, span: 2, strong: true },
      { label: 'Spec version', value: `Version ${spec.version}` },
      { label: 'Thickness band', value: spec.band },
      { label: 'Acceptance rule', value: spec.acceptanceRule, span: 4 },
    ],
    4,
  )
}

/** Type 2.1 carries no results: the required grade and profile only, no climate. */
export function drawPreparationAndClimate(sheet: Sheet, data: CertificateData): void {
  const prep = data.surfacePrep
  const withResults = data.kind !== '2.1'
  const fields: Field[] = prep
    ? [
        { label: 'Surface preparation required', value: prep.gradeRequired },
        ...(withResults ? [{ label: 'Grade recorded', value: prep.gradesRecorded }] : []),
        { label: 'Surface profile band', value: prep.profileBand },
        ...(withResults ? [{ label: 'Profile recorded', value: prep.profileRecorded }] : []),
      ]
    : [{ label: 'Surface preparation', value: NOT_APPLICABLE }]
  if (withResults) {
    fields.push({
      label: 'Climate at coating',
      value: data.climate?.summary ?? NOT_APPLICABLE,
      span: 4,
    })
  }
  section(sheet, withResults ? 'Surface preparation and climate' : 'Surface preparation', fields, 4)
}
