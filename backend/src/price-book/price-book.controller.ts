import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  ParseUUIDPipe,
  Patch,
  Post,
  Query,
} from '@nestjs/common';
import { ApiBearerAuth, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { PriceBookItem } from '@loambook/common';
import { Can, CurrentUser } from '../common/decorators';
import type { SessionUser } from '../auth/session-user';
import { CreatePriceBookItemDto, PriceBookQueryDto, UpdatePriceBookItemDto } from './dto/price-book.dto';
import { PriceBookService } from './price-book.service';

@ApiTags('price book')
@ApiBearerAuth()
@Controller()
export class PriceBookController {
  constructor(private readonly priceBook: PriceBookService) {}

  @Get('branches/:branchId/price-book')
  @Can('read', 'PriceBook')
  @ApiOperation({ summary: "A branch's price book: active items, or all with ?includeInactive=true" })
  list(
    @CurrentUser() user: SessionUser,
    @Param('branchId', ParseUUIDPipe) branchId: string,
    @Query() query: PriceBookQueryDto,
  ): Promise<PriceBookItem[]> {
    return this.priceBook.list(user, branchId, query.includeInactive === 'true');
  }

  @Post('branches/:branchId/price-book')
  @Can('create', 'PriceBook')
  create(
    @CurrentUser() user: SessionUser,
    @Param('branchId', ParseUUIDPipe) branchId: string,
    @Body() dto: CreatePriceBookItemDto,
  ): Promise<PriceBookItem> {
    return this.priceBook.create(user, branchId, dto);
  }

  @Patch('price-book/:id')
  @Can('update', 'PriceBook')
  @ApiOperation({
    summary: 'Change an item (proposals already made keep their copy); {active:false} deactivates',
  })
  update(
    @CurrentUser() user: SessionUser,
    @Param('id', ParseUUIDPipe) id: string,
    @Body() dto: UpdatePriceBookItemDto,
  ): Promise<PriceBookItem> {
    return this.priceBook.update(user, id, dto);
  }

  @Delete('price-book/:id')
  @Can('delete', 'PriceBook')
  @HttpCode(204)
  @ApiOperation({
    summary: 'Delete an item no proposal uses (otherwise 409 PRICE_BOOK.ITEM_IN_USE: deactivate it)',
  })
  delete(@CurrentUser() user: SessionUser, @Param('id', ParseUUIDPipe) id: string): Promise<void> {
    return this.priceBook.delete(user, id);
  }
}
