import { describe, expect, it } from 'vitest'
import { paperworkForm, paperworkSchema } from './paperworkForm'

const TODAY = '2026-12-10'
const messagesOf = (result: { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } }) =>
  Object.fromEntries((result.error?.issues ?? []).map((issue) => [String(issue.path[0]), issue.message]))

describe('the paperwork steps as forms', () => {
  it('holds only the step’s own fields, dates that have happened starting at today', () => {
    expect(paperworkForm('record_submission', TODAY)).toEqual({ method: '', submittedOn: TODAY, ahjReference: '', feeAmount: '', feeDueOn: '' })
    expect(paperworkForm('record_corrections', TODAY)).toEqual({ letterFileId: '', receivedOn: TODAY, responseDueOn: '', items: '' })
    expect(paperworkForm('record_resubmittal', TODAY)).toEqual({ resubmittedOn: TODAY })
    expect(paperworkForm('record_permit', TODAY)).toEqual({ permitNumber: '', issuedOn: TODAY, expiresOn: '', inspectionOn: '' })
  })

  it('reads the form as the step’s details: empty optional fields left out, items one per line', () => {
    const corrections = paperworkSchema('record_corrections', TODAY).safeParse({
      note: 'not a detail', letterFileId: '1d2e3f40-5a6b-4c7d-8e9f-0a1b2c3d4e5f', receivedOn: '2026-12-08', responseDueOn: '2026-12-22', items: ' one \n\ntwo\n',
    })
    expect(corrections.data).toEqual({ letterFileId: '1d2e3f40-5a6b-4c7d-8e9f-0a1b2c3d4e5f', receivedOn: '2026-12-08', responseDueOn: '2026-12-22', items: ['one', 'two'] })
    const submission = paperworkSchema('record_submission', TODAY).safeParse({ ...paperworkForm('record_submission', TODAY), method: 'email', ahjReference: '  ' })
    expect(submission.data).toEqual({ method: 'email', submittedOn: TODAY })
  })

  it('checks each date rule as soon as its own dates are typed, whatever else is missing', () => {
    const permit = paperworkSchema('record_permit', TODAY).safeParse({ permitNumber: '', issuedOn: '2026-12-11', expiresOn: '2026-12-01', inspectionOn: '' })
    expect(messagesOf(permit)).toEqual({ permitNumber: 'must not be empty', issuedOn: 'must not be after today', expiresOn: 'must be after the permit was issued' })
    const corrections = paperworkSchema('record_corrections', TODAY).safeParse({ letterFileId: '', receivedOn: TODAY, responseDueOn: '2026-12-09', items: '' })
    expect(messagesOf(corrections)).toMatchObject({ responseDueOn: 'must not be before the letter was received', items: 'must list at least one item of the letter' })
  })
})
