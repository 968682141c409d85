import {
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Post,
  Query,
  Req,
  UploadedFile,
  UseFilters,
  UseInterceptors,
} from '@nestjs/common';
import { FileInterceptor } from '@nestjs/platform-express';
import { ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request } from 'express';
import type { BankAccount, BankStatement, BankStatementLine, BankStatementPreview } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import { DomainError } from '../common/domain-error';
import type { SessionUser } from '../auth/session-user';
import { BankStatementsService } from './bank-statements.service';
import {
  BANK_CSV_MAX_BYTES,
  cleanFileName,
  CsvUploadErrorsFilter,
  type CsvFile,
  type UploadedCsvFile,
} from './csv-file';
import {
  CreateBankAccountDto,
  PreviewStatementDto,
  StatementsQueryDto,
  UploadStatementDto,
} from './dto/reconciliation.dto';

const upload = FileInterceptor('file', { limits: { fileSize: BANK_CSV_MAX_BYTES, files: 1, fields: 6 } });

const fromUpload = (f: UploadedCsvFile | undefined): CsvFile | null =>
  f ? { fileName: cleanFileName(f.originalname), bytes: f.buffer } : null;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The multipart fields of a preview, checked as PreviewStatementDto would. */
function previewFields(body: unknown): PreviewStatementDto {
  const b = (typeof body === 'object' && body !== null ? body : {}) as Record<string, unknown>;
  const known = new Set(['bankAccountId', 'fileName', 'mapping']);
  const errors: { field: string; message: string }[] = [];
  for (const k of Object.keys(b)) {
    if (!known.has(k)) errors.push({ field: k, message: `${k} is not a field this request takes.` });
  }
  const str = (k: string, max: number) => {
    const v = b[k];
    if (v === undefined || v === '') return undefined;
    if (typeof v !== 'string' || v.length > max) {
      errors.push({ field: k, message: `At most ${max} characters.` });
      return undefined;
    }
    return v;
  };
  const bankAccountId = str('bankAccountId', 36);
  if (bankAccountId && !UUID.test(bankAccountId))
    errors.push({ field: 'bankAccountId', message: 'Unknown bank account.' });
  const fields = { bankAccountId, fileName: str('fileName', 255), mapping: str('mapping', 2000) };
  if (errors.length > 0)
    throw new DomainError('invalid', 'VALIDATION.FAILED', 'Some fields need attention.', errors);
  return fields;
}

/** Bank accounts and their statements: upload a CSV with a column-mapping step. */
@ApiTags('reconciliation')
@ApiBearerAuth()
@Controller()
export class BankStatementsController {
  constructor(private readonly service: BankStatementsService) {}

  @Get('bank-accounts')
  @Can('read', 'Reconciliation')
  accounts(@CurrentUser() user: SessionUser): Promise<BankAccount[]> {
    return this.service.accounts(user);
  }

  @Post('bank-accounts')
  @HttpCode(201)
  @Can('create', 'Reconciliation')
  createAccount(@CurrentUser() user: SessionUser, @Body() dto: CreateBankAccountDto): Promise<BankAccount> {
    return this.service.createAccount(user, dto);
  }

  @Post('bank-statements/preview')
  @HttpCode(200)
  @Can('read', 'Reconciliation')
  @UseFilters(CsvUploadErrorsFilter)
  @UseInterceptors(upload)
  @ApiOperation({
    summary: 'The first rows of a CSV and a first column mapping (the account’s saved one, or a guess)',
    description:
      'Send the file as multipart (field "file", with bankAccountId and mapping as fields) or as a ' +
      'text/csv body (bankAccountId, fileName and mapping in the query string). Nothing is stored.',
  })
  @ApiConsumes('multipart/form-data', 'text/csv')
  preview(
    @CurrentUser() user: SessionUser,
    @UploadedFile() file: UploadedCsvFile | undefined,
    @Req() req: Request,
    // Not a DTO: the body is a string (text/csv) or multipart fields; the fields are checked below.
    @Body() body: unknown,
    @Query() query: PreviewStatementDto,
  ): Promise<BankStatementPreview> {
    const multipart = fromUpload(file);
    const text = typeof req.body === 'string' ? (req.body as string) : null;
    const fields = multipart ? previewFields(body) : query;
    const csv: CsvFile | null =
      multipart ??
      (text !== null ? { fileName: cleanFileName(query.fileName), bytes: Buffer.from(text, 'utf8') } : null);
    return this.service.preview(user, csv ?? { fileName: 'statement.csv', bytes: Buffer.alloc(0) }, {
      bankAccountId: fields.bankAccountId,
      mapping: fields.mapping,
    });
  }

  @Post('bank-statements')
  @HttpCode(201)
  @Can('create', 'Reconciliation')
  @UseFilters(CsvUploadErrorsFilter)
  @UseInterceptors(upload)
  @ApiOperation({
    summary: 'Store a statement: the file, its account and the column mapping (remembered on the account)',
    description:
      'All or nothing: if any row is invalid nothing is stored and 422 BANK_STATEMENT.ROWS_INVALID lists ' +
      'every bad row by number, unless skipInvalidRows is true (the valid rows are stored and the others ' +
      'kept as skipped). The same file twice on one account: 409 BANK_STATEMENT.DUPLICATE_FILE.',
  })
  @ApiConsumes('multipart/form-data')
  @ApiBody({
    schema: {
      type: 'object',
      required: ['file', 'bankAccountId', 'mapping'],
      properties: {
        file: { type: 'string', format: 'binary', description: 'The bank’s CSV export, at most 5 MB' },
        bankAccountId: { type: 'string', format: 'uuid' },
        mapping: { type: 'string', description: 'The column mapping as JSON' },
        skipInvalidRows: { type: 'boolean', default: false },
      },
    },
  })
  upload(
    @CurrentUser() user: SessionUser,
    @UploadedFile() file: UploadedCsvFile | undefined,
    @Body() dto: UploadStatementDto,
  ): Promise<BankStatement> {
    return this.service.upload(user, fromUpload(file), dto);
  }

  @Get('bank-statements')
  @Can('read', 'Reconciliation')
  statements(@CurrentUser() user: SessionUser, @Query() q: StatementsQueryDto): Promise<BankStatement[]> {
    return this.service.statements(user, q);
  }

  @Get('bank-statements/:id/lines')
  @Can('read', 'Reconciliation')
  lines(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
  ): Promise<BankStatementLine[]> {
    return this.service.lines(user, id);
  }
}
