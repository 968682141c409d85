import { Inject, Injectable, Logger } from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { Knex } from 'knex';
import {
  asSubject,
  formatWarrantyNumber,
  INSTALL_KIND_LABELS,
  todayInZone,
  WARRANTY_CAUTION,
  warrantyEndsOn,
  warrantySequence,
  type Warranty,
} from '@loambook/common';
import type { SessionUser } from '../auth/session-user';
import { conflict, DomainError } from '../common/domain-error';
import { KNEX } from '../database/database.module';
import { inTransaction } from '../database/transaction';
import type { JobRecord } from '../jobs/jobs.repository';
import { Clock } from '../signing/clock';
import { StorageService, StoredObjectMissingError } from '../storage/storage.service';
import type { WarrantyDto } from './dto/field.dto';
import { FieldAccess } from './field-access';
import { FieldRepository, toWarranty, type WarrantyRecord } from './field.repository';
import { renderWarrantyPdf } from './warranty-pdf';

/** The plan lines that are work on the house (not labour hours, mobilisation, permits or engineering). */
const WORK_CATEGORIES = ['soil_stabilisation', 'piers', 'helical_piles', 'drainage'];

const noWarranty = () =>
  new DomainError('not_found', 'WARRANTY.NOT_FOUND', 'No warranty has been issued for this job yet.');

/**
 * One warranty per completed job, issued by the office (whoever may change the job's contract: the
 * branch manager or the owner), numbered per branch ("W-<branch code>-0001"), with a certificate PDF
 * kept in the bucket like the contracts' PDFs.
 */
@Injectable()
export class WarrantyService {
  private readonly logger = new Logger('Warranties');

  constructor(
    private readonly access: FieldAccess,
    private readonly repo: FieldRepository,
    private readonly storage: StorageService,
    private readonly clock: Clock,
    @Inject(KNEX) private readonly knex: Knex,
  ) {}

  async issue(user: SessionUser, jobId: string, dto: WarrantyDto): Promise<Warranty> {
    const job = await this.access.writable(user, jobId);
    ForbiddenError.from(user.ability).throwUnlessCan(
      'update',
      asSubject('Contract', { branchId: job.branchId, salespersonId: job.salespersonId }),
    );
    if (job.status !== 'completed') {
      throw conflict('JOB.NOT_COMPLETED', 'A warranty is issued once the job is completed.');
    }
    const issuedOn = todayInZone(job.timezone, this.clock.now());
    await inTransaction(this.knex, async (trx) => {
      if (await this.repo.warranty(jobId, trx)) {
        throw conflict('WARRANTY.ALREADY_ISSUED', 'This job already has its warranty.');
      }
      const numbers = await this.repo.warrantyNumbers(job.branchId, trx);
      const last = Math.max(0, ...numbers.map((n) => warrantySequence(job.branchCode, n) ?? 0));
      await this.repo.insertWarranty(
        {
          jobId,
          branchId: job.branchId,
          number: formatWarrantyNumber(job.branchCode, last + 1),
          termYears: dto.termYears,
          covers: dto.covers,
          exclusions: dto.exclusions?.trim() || null,
          transferable: dto.transferable,
          issuedOn,
          issuedBy: user.id,
        },
        trx,
      );
    });
    const w = (await this.repo.warranty(jobId))!;
    // The record stands even if the bucket is unreachable now: the certificate is made on first download.
    await this.storePdf(job, w).catch((err) =>
      this.logger.warn({ err, jobId }, 'Warranty PDF not stored yet'),
    );
    return toWarranty(w);
  }

  async get(user: SessionUser, jobId: string): Promise<Warranty> {
    await this.access.readable(user, jobId);
    const w = await this.repo.warranty(jobId);
    if (!w) throw noWarranty();
    return toWarranty(w);
  }

  async certificate(user: SessionUser, jobId: string): Promise<{ pdf: Buffer; filename: string }> {
    const job = await this.access.readable(user, jobId);
    const w = await this.repo.warranty(jobId);
    if (!w) throw noWarranty();
    const filename = `warranty-${w.number}.pdf`;
    if (w.pdfKey) {
      try {
        return { pdf: await this.storage.getBuffer(w.pdfKey), filename };
      } catch (e) {
        if (!(e instanceof StoredObjectMissingError)) throw e;
        this.logger.warn({ jobId, key: w.pdfKey }, 'Stored warranty PDF missing: made again');
      }
    }
    return { pdf: await this.storePdf(job, w), filename };
  }

  private async storePdf(job: JobRecord, w: WarrantyRecord): Promise<Buffer> {
    const pdf = await this.render(job, w);
    const key = `branches/${job.branchId}/warranties/${w.id}.pdf`;
    await this.storage.put(key, pdf, 'application/pdf');
    await this.repo.setWarrantyPdfKey(w.id, key);
    return pdf;
  }

  private async render(job: JobRecord, w: WarrantyRecord): Promise<Buffer> {
    const [extras, lines, totals] = await Promise.all([
      this.repo.extras(job.id),
      this.repo.planLinesOf([job.id]),
      this.repo.logTotals([job.id]),
    ]);
    const t = totals.get(job.id)!;
    const installed: string[] = [];
    if (t.injectionPoints > 0) {
      installed.push(
        `${t.injectionPoints} ${INSTALL_KIND_LABELS.injection.toLowerCase()}${t.injectionPoints === 1 ? '' : 's'}, ` +
          `${t.pounds.replace(/\.?0+$/, '')} lb of material in all`,
      );
    }
    if (t.pushPiers > 0) installed.push(`${t.pushPiers} push pier${t.pushPiers === 1 ? '' : 's'}`);
    if (t.helicalPiles > 0)
      installed.push(`${t.helicalPiles} helical pile${t.helicalPiles === 1 ? '' : 's'}`);
    const completedOn = job.completedAt ? todayInZone(job.timezone, new Date(job.completedAt)) : null;
    return renderWarrantyPdf({
      number: w.number,
      issuedOn: w.issuedOn,
      endsOn: warrantyEndsOn(w.issuedOn, w.termYears),
      termYears: w.termYears,
      covers: w.covers,
      exclusions: w.exclusions,
      transferable: w.transferable,
      branch: {
        name: extras.branchName,
        addressLine1: extras.branchAddressLine1,
        city: extras.branchCity,
        state: extras.branchState,
        postalCode: extras.branchPostalCode,
        phone: extras.branchPhone,
      },
      homeownerName: job.homeownerName,
      property: {
        addressLine1: job.addressLine1,
        city: job.city,
        state: job.state,
        postalCode: job.postalCode,
      },
      jobNumber: job.number,
      completedOn,
      work: lines
        .filter((l) => l.unit !== 'hour' && WORK_CATEGORIES.includes(l.category))
        .map((l) => ({ description: l.description, quantity: l.quantity, unit: l.unit })),
      installed,
      caution: WARRANTY_CAUTION,
    });
  }
}
