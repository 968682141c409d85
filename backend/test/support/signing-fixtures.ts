import sharp from 'sharp';
import type { Knex } from 'knex';

/**
 * Fixtures for the sending and signing tests: a completed inspection with findings and a survey, and
 * drawn signatures (ink, blank, white). Invented data only.
 */

/** Every checklist item answered. */
export const FULL_FINDINGS = {
  interiorCracks: [{ location: 'Living room, NE corner', widthIn: '0.125', orientation: 'diagonal' }],
  exteriorCracks: [
    { location: 'East brick wall', widthIn: '0.25', orientation: 'stair_step', note: 'Widens upward' },
  ],
  doorsWindowsSticking: [{ location: 'Back bedroom door' }],
  floorSlope: { observed: true, note: 'Ball rolls toward the back bedroom' },
  erosion: { observed: false },
  drainage: { gutters: 'partial', downspoutsDischargeNearFoundation: true, grading: 'toward' },
  wallRotation: { observed: false },
  plumbingLeaks: { observed: false },
  soil: { type: 'clay', moisture: 'dry' },
};

/**
 * 1.0 in lower over 25 ft (300 in) between A and B: β = 1/300 (REFERENCE-VALUES.md worked example),
 * the band "beyond-1/300" (Skempton & MacDonald 1956, secondary).
 */
export const SURVEY = [
  { label: 'A', x: '0', y: '0', z: '0' },
  { label: 'B', x: '25', y: '0', z: '-1' },
  { label: 'C', x: '0', y: '25', z: '-0.25' },
];

export async function makeCompletedInspection(
  db: Knex,
  leadId: string,
  branchId: string,
  completedAt = '2026-06-30T15:00:00Z',
): Promise<string> {
  const [row] = await db('inspections')
    .insert({
      lead_id: leadId,
      branch_id: branchId,
      scheduled_at: '2026-06-30T13:30:00Z',
      status: 'completed',
      completed_at: completedAt,
      findings: JSON.stringify(FULL_FINDINGS),
      summary: 'Settlement at the east wall; water pools at the NE corner.',
    })
    .returning('id');
  await db('survey_points').insert(
    SURVEY.map((p, position) => ({
      inspection_id: row.id,
      branch_id: branchId,
      kind: 'inspection',
      position,
      label: p.label,
      x_ft: p.x,
      y_ft: p.y,
      elevation_in: p.z,
      is_reference: p.label === 'A',
    })),
  );
  return row.id;
}

const dataUrl = (png: Buffer) => `data:image/png;base64,${png.toString('base64')}`;

/** A signature: a dark stroke on a transparent canvas, as a signature pad draws it. */
export async function inkSignature(): Promise<string> {
  const svg = Buffer.from(
    `<svg xmlns="http://www.w3.org/2000/svg" width="400" height="120">
       <path d="M20 90 C 60 10, 90 10, 120 80 S 180 100, 220 40 S 300 20, 380 90" stroke="#102040" stroke-width="4" fill="none"/>
     </svg>`,
  );
  return dataUrl(await sharp(svg).png().toBuffer());
}

/** Nothing drawn: a fully transparent canvas. */
export async function blankSignature(): Promise<string> {
  const png = await sharp({
    create: { width: 400, height: 120, channels: 4, background: { r: 0, g: 0, b: 0, alpha: 0 } },
  })
    .png()
    .toBuffer();
  return dataUrl(png);
}

/** Nothing drawn on a white, opaque canvas. */
export async function whiteSignature(): Promise<string> {
  const png = await sharp({ create: { width: 400, height: 120, channels: 3, background: '#ffffff' } })
    .png()
    .toBuffer();
  return dataUrl(png);
}

/** A JPEG labelled as a PNG. */
export async function jpegAsPng(): Promise<string> {
  const jpeg = await sharp({ create: { width: 40, height: 40, channels: 3, background: '#000000' } })
    .jpeg()
    .toBuffer();
  return dataUrl(jpeg);
}
