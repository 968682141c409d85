import type { CalendarResponse, InstallLogResponse, JobDetail, SurveyComparison } from '@loambook/common';
import { BRANCH_IDS } from '@/testing/render';

export const JOB_ID = '55555555-5555-4555-8555-555555555555';
export const OTHER_JOB_ID = '66666666-6666-4666-8666-666666666666';
export const CREW_A = '77777777-7777-4777-8777-777777777777';
export const CREW_B = '88888888-8888-4888-8888-888888888888';
export const CREW_LEAD_ID = '00000000-0000-4000-8000-000000000005';
export const SALESPERSON_ID = '00000000-0000-4000-8000-000000000003';

export function makeJob(overrides: Partial<JobDetail> = {}): JobDetail {
  return {
    id: JOB_ID,
    number: 'MRW-J-0042',
    branchId: BRANCH_IDS.mrw,
    branchCode: 'MRW',
    leadId: 'lead-1',
    contractId: 'contract-1',
    homeownerName: 'Marisol Ebbing',
    addressLine1: '18 Quarry Lane',
    city: 'Marrowfield',
    status: 'scheduled',
    crewId: CREW_A,
    crewName: 'Crew 1',
    crewLeadId: CREW_LEAD_ID,
    salespersonId: SALESPERSON_ID,
    salespersonName: 'salesperson person',
    startOn: '2026-12-08',
    durationDays: 2,
    price: '9850.00',
    risk: 'none',
    conflict: false,
    phonePrimary: '555-0142',
    email: 'marisol.ebbing@example.test',
    state: 'FL',
    postalCode: '32901',
    timezone: 'America/New_York',
    signedOn: '2026-12-01',
    lastDayToCancel: '2026-12-04',
    depositAmount: '985.00',
    depositReceivedAt: '2026-12-02T15:00:00.000Z',
    windowWaivedAt: null,
    windowWaiverNote: null,
    permit: { needed: false, appliedOn: null, number: null, issuedOn: null, inspectionPassedOn: null },
    locate: {
      ticketNumber: 'FL-2026-118',
      filedOn: '2026-12-02',
      earliestDigOn: '2026-12-07',
      expiresOn: '2026-12-30',
    },
    plan: [
      {
        code: 'INJ-PT',
        description: 'Polyurethane injection point',
        category: 'soil_stabilisation',
        unit: 'point',
        quantity: '12',
        unitCost: '95.00',
        unitPrice: '265.00',
      },
    ],
    planned: { injectionPoints: '12', pushPiers: '0', helicalPiles: '0', materialLb: '180' },
    clocks: [],
    startBlockers: [],
    conflicts: [],
    startedAt: null,
    completedAt: null,
    estimatedLabourHours: '32',
    labourCostPerHour: '38.00',
    cautions: [],
    can: { schedule: true, editPermits: true, start: true, log: true, complete: true },
    ...overrides,
  };
}

export function makeCalendar(overrides: Partial<CalendarResponse> = {}): CalendarResponse {
  return {
    branchId: BRANCH_IDS.mrw,
    from: '2026-12-07',
    to: '2026-12-20',
    crews: [
      {
        id: CREW_A,
        name: 'Crew 1',
        leadName: 'Hollis Varga',
        jobs: [
          {
            jobId: JOB_ID,
            number: 'MRW-J-0042',
            homeownerName: 'Marisol Ebbing',
            city: 'Marrowfield',
            status: 'scheduled',
            startOn: '2026-12-08',
            durationDays: 2,
            conflict: true,
            risk: 'none',
          },
          {
            jobId: OTHER_JOB_ID,
            number: 'MRW-J-0043',
            homeownerName: 'Dorrit Vane',
            city: 'Eastbrook',
            status: 'scheduled',
            startOn: '2026-12-09',
            durationDays: 1,
            conflict: true,
            risk: 'due_soon',
          },
        ],
      },
      { id: CREW_B, name: 'Crew 2', leadName: 'Pell Asante', jobs: [] },
    ],
    unscheduled: [],
    ...overrides,
  };
}

export const emptyLog = (): InstallLogResponse => ({
  entries: [],
  dayNotes: [],
  photos: [],
  totals: { injectionPoints: 0, pounds: '0', pushPiers: 0, helicalPiles: 0, flagged: 0 },
});

export const beforeSurvey = (): SurveyComparison => ({
  before: [
    { label: 'A', xFt: '0.00', yFt: '0.00', elevationIn: '0.00' },
    { label: 'B', xFt: '30.00', yFt: '0.00', elevationIn: '-0.50' },
    { label: 'C', xFt: '30.00', yFt: '20.00', elevationIn: '-1.50' },
  ],
  after: [],
  beforeMaxDifferentialIn: '1.50',
  afterMaxDifferentialIn: null,
  beforeWorstRatio: '1/240',
  afterWorstRatio: null,
  changes: [],
});
