import { BaseSequencer, type TestSpecification } from 'vitest/node'

/**
 * Vitest's order for every project, except that the browser journeys (one shared app, one after
 * the other) run in the order of their file names: the designer's journey first, while the
 * plan-set worker is still cold, so that its progress bar is seen part-way (a warm worker can
 * finish a residential set between two polls of the page).
 */
export class JourneyOrder extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files)
    const isJourney = (f: TestSpecification) => f.project.name === 'browser'
    const journeys = sorted.filter(isJourney).sort((a, b) => a.moduleId.localeCompare(b.moduleId))
    return sorted.map((f) => (isJourney(f) ? journeys.shift()! : f))
  }
}
