import { BadRequestException, Body, Controller, Get, HttpCode, NotFoundException, Param, Patch, Post, Query, Req, Res, StreamableFile } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type {
  Certificate,
  CertificateCheckResult,
  CertificateDetail,
  CertificateSettings,
  CertificateSigningKey,
  ListResponse,
  PublicCertificate,
} from '@kilocycle/common/types';
import { MANAGER_ROLES } from '@kilocycle/common/rules';
import type { AuthUser } from '../shared/auth-user.js';
import { CurrentUser, Public, Roles } from '../shared/decorators.js';
import { CertificatesService } from './certificates.service.js';
import { AmendCertificateDto, ListCertificatesQueryDto, UpdateSettingsDto, WithdrawCertificateDto } from './dto/certificate.dto.js';
import { IdParam } from '../shared/id-param.decorator.js';

/** Anything but a whole number (a file name, a path) is simply not found. */
const CertificateId = () => IdParam('id', { refuse: () => new NotFoundException('Certificate not found') });

@ApiTags('certificates')
@ApiBearerAuth()
@Controller('certificates')
export class CertificatesController {
  constructor(private readonly certificates: CertificatesService) {}

  /** Scoped: a client sees only its organisation's certificates (never drafts). */
  @Get()
  list(@CurrentUser() user: AuthUser, @Query() query: ListCertificatesQueryDto): Promise<ListResponse<Certificate>> {
    return this.certificates.list(user, query);
  }

  @Get(':id')
  get(@CurrentUser() user: AuthUser, @CertificateId() id: number): Promise<CertificateDetail> {
    return this.certificates.get(user, id);
  }

  @Get(':id/pdf')
  async pdf(@CurrentUser() user: AuthUser, @CertificateId() id: number, @Res({ passthrough: true }) res: Response): Promise<StreamableFile> {
    const file = await this.certificates.pdf(user, id);
    res.set({
      'Content-Type': 'application/pdf',
      'Content-Disposition': `attachment; filename="${file.name}"`,
      'Cache-Control': 'private, no-store',
    });
    return new StreamableFile(file.data);
  }

  @Roles('lead')
  @Post(':id/amend')
  @HttpCode(200)
  amend(@CurrentUser() user: AuthUser, @CertificateId() id: number, @Body() body: AmendCertificateDto): Promise<CertificateDetail> {
    return this.certificates.amend(user, id, body);
  }

  @Roles('lead')
  @Post(':id/withdraw')
  @HttpCode(200)
  withdraw(@CurrentUser() user: AuthUser, @CertificateId() id: number, @Body() body: WithdrawCertificateDto): Promise<CertificateDetail> {
    return this.certificates.withdraw(user, id, body.reason);
  }
}

@ApiTags('settings')
@ApiBearerAuth()
@Controller('settings')
export class SettingsController {
  constructor(private readonly certificates: CertificatesService) {}

  @Roles(...MANAGER_ROLES)
  @Get()
  get(): Promise<CertificateSettings> {
    return this.certificates.settings();
  }

  @Roles('admin')
  @Patch()
  update(@CurrentUser() user: AuthUser, @Body() body: UpdateSettingsDto): Promise<CertificateSettings> {
    return this.certificates.updateSettings(user, body);
  }
}

/** The public verification API (no sign-in): status, instrument and customer; no measurement data. */
@ApiTags('public')
@Public()
@Controller('public')
export class PublicCertificatesController {
  constructor(private readonly certificates: CertificatesService) {}

  @Get('certificates/:number')
  get(@Param('number') number: string): Promise<PublicCertificate> {
    return this.certificates.publicView(number);
  }

  /** The PDF as the raw body (application/pdf) or the multipart field `file`; at most 20 MB. */
  @Post('certificates/:number/check')
  @HttpCode(200)
  check(@Param('number') number: string, @Req() req: Request & { file?: { buffer: Buffer } }): Promise<CertificateCheckResult> {
    const file = req.file?.buffer ?? (Buffer.isBuffer(req.body) ? (req.body as Buffer) : null);
    if (!file || file.length === 0) {
      throw new BadRequestException('Send the PDF as the request body (Content-Type: application/pdf) or as the multipart field "file"');
    }
    return this.certificates.check(number, file);
  }

  @Get('certificate-key')
  key(): CertificateSigningKey {
    return this.certificates.signingKey();
  }
}
