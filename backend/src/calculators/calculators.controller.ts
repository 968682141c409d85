import { Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { CalculatorsService } from './calculators.service';

/**
 * The scope and deadline calculators of common/, served so the screens compute live and other tools
 * can call them. Decimal values are strings in and out. Any signed-in user may call them.
 */
@ApiTags('calculators')
@ApiBearerAuth()
@Controller('calculators')
export class CalculatorsController {
  constructor(private readonly calculators: CalculatorsService) {}

  @Post('injection-plan')
  @HttpCode(200)
  @ApiOperation({
    summary: 'Injection points and material for a run of wall: open floor(L/s)+1, closed ceil(L/s)',
  })
  @ApiBody({
    schema: { example: { runLengthFt: '42', spacingFt: '5', depthFt: '5', lbPerPoint: '20', closed: false } },
  })
  injectionPlan(@Body() body: Record<string, unknown>) {
    return this.calculators.run('injection-plan', body);
  }

  @Post('pier-plan')
  @HttpCode(200)
  @ApiOperation({ summary: 'Number of piers along a run at a given spacing' })
  @ApiBody({ schema: { example: { runLengthFt: '36', spacingFt: '6' } } })
  pierPlan(@Body() body: Record<string, unknown>) {
    return this.calculators.run('pier-plan', body);
  }

  @Post('helical-capacity')
  @HttpCode(200)
  @ApiOperation({ summary: 'Helical pile capacity from installation torque: Qu = Kt·T, allowable = Qu/2' })
  @ApiBody({ schema: { example: { shaft: '1.5in-square', torqueFtLb: '6500', designLoadLb: '30000' } } })
  helicalCapacity(@Body() body: Record<string, unknown>) {
    return this.calculators.run('helical-capacity', body);
  }

  @Post('settlement')
  @HttpCode(200)
  @ApiOperation({
    summary: 'Screening figures from a floor-elevation survey (not an engineering determination)',
  })
  @ApiBody({
    schema: {
      example: {
        points: [
          { label: 'A', xFt: '0', yFt: '0', elevationIn: '0' },
          { label: 'B', xFt: '25', yFt: '0', elevationIn: '-1.0' },
        ],
      },
    },
  })
  settlement(@Body() body: Record<string, unknown>) {
    return this.calculators.run('settlement', body);
  }

  @Post('cancellation-deadline')
  @HttpCode(200)
  @ApiOperation({ summary: 'Last day to cancel a home-solicitation sale under 16 CFR 429' })
  @ApiBody({ schema: { example: { signedOn: '2026-07-02' } } })
  cancellationDeadline(@Body() body: Record<string, unknown>) {
    return this.calculators.run('cancellation-deadline', body);
  }

  @Post('dig-date')
  @HttpCode(200)
  @ApiOperation({ summary: 'Earliest dig date after an 811 ticket, for states with a rule pack' })
  @ApiBody({ schema: { example: { state: 'FL', filedOn: '2026-11-25' } } })
  digDate(@Body() body: Record<string, unknown>) {
    return this.calculators.run('dig-date', body);
  }

  @Post('deposit-rules')
  @HttpCode(200)
  @ApiOperation({ summary: 'Notices a contract needs and the clocks a deposit starts' })
  @ApiBody({
    schema: { example: { state: 'FL', contractPrice: '18500.00', deposit: '2500.00', paidOn: '2026-12-01' } },
  })
  depositRules(@Body() body: Record<string, unknown>) {
    return this.calculators.run('deposit-rules', body);
  }
}
