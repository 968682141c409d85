import { Injectable } from '@nestjs/common';
import {
  CalculatorInputError,
  StatePackMissingError,
  cancellationDeadline,
  depositRules,
  earliestDigDate,
  helicalCapacity,
  injectionPlan,
  pierPlan,
  settlement,
} from '@loambook/common';
import { DomainError } from '../common/domain-error';

/** The fields each calculator takes; anything else is refused, as for every other request body. */
const CALCULATORS = {
  'injection-plan': {
    fields: ['runLengthFt', 'spacingFt', 'depthFt', 'lbPerPoint', 'lbPerDrumSet', 'closed'],
    run: injectionPlan,
  },
  'pier-plan': { fields: ['runLengthFt', 'spacingFt', 'closed'], run: pierPlan },
  'helical-capacity': { fields: ['shaft', 'torqueFtLb', 'designLoadLb', 'ktPerFt'], run: helicalCapacity },
  settlement: { fields: ['points'], run: settlement },
  'cancellation-deadline': { fields: ['signedOn'], run: cancellationDeadline },
  'dig-date': { fields: ['state', 'filedOn'], run: earliestDigDate },
  'deposit-rules': {
    fields: ['state', 'contractPrice', 'deposit', 'paidOn', 'permitIssuedOn', 'signedOn', 'property'],
    run: depositRules,
  },
} as const;

export type CalculatorName = keyof typeof CALCULATORS;
export const CALCULATOR_NAMES = Object.keys(CALCULATORS) as CalculatorName[];

const SETTLEMENT_POINT_FIELDS = ['label', 'xFt', 'yFt', 'elevationIn'];

@Injectable()
export class CalculatorsService {
  run(name: CalculatorName, body: unknown): unknown {
    const calculator = CALCULATORS[name];
    const unknownFields = this.unknownFields(name, body, calculator.fields);
    if (unknownFields.length) {
      throw new DomainError(
        'invalid',
        'VALIDATION.FAILED',
        'Some fields need attention.',
        unknownFields.map((field) => ({ field, message: `${field} is not a field this calculator takes.` })),
      );
    }
    try {
      return (calculator.run as (input: unknown) => unknown)(body);
    } catch (e) {
      if (e instanceof StatePackMissingError) {
        throw new DomainError('rule', e.code, e.message, e.details);
      }
      if (e instanceof CalculatorInputError) {
        throw new DomainError('invalid', 'VALIDATION.FAILED', e.message, e.details);
      }
      throw e;
    }
  }

  private unknownFields(name: CalculatorName, body: unknown, fields: readonly string[]): string[] {
    if (typeof body !== 'object' || body === null || Array.isArray(body)) return [];
    const extra = Object.keys(body).filter((k) => !fields.includes(k));
    if (name === 'settlement') {
      const points = (body as { points?: unknown }).points;
      if (Array.isArray(points)) {
        points.forEach((p, i) => {
          if (typeof p === 'object' && p !== null) {
            for (const k of Object.keys(p))
              if (!SETTLEMENT_POINT_FIELDS.includes(k)) extra.push(`points[${i}].${k}`);
          }
        });
      }
    }
    return extra;
  }
}
