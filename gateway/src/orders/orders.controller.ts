import { Body, Controller, Get, HttpCode, Param, ParseIntPipe, Post, Query } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import {
  countersignRequestSchema,
  createOrderRequestSchema,
  decisionRequestSchema,
  withdrawRequestSchema,
  type CreateOrderRequest,
  type DecisionRequest,
  type InterlockReport,
  type Order,
} from '@stillwell/shared/orders';
import type { Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { ZodApiBody } from './api-doc';
import { OrderQueryDto } from './dto/order-query.dto';
import { OrderExecution } from './order-execution.service';
import { OrdersService } from './orders.service';
import { ZodBodyPipe } from './zod-body.pipe';

const orderId = new ParseIntPipe({ errorHttpStatusCode: 400 });

/** Gate operation orders: draft, review (two-person rule), execute, withdraw, countersign. */
@ApiTags('orders')
@Controller()
export class OrdersController {
  constructor(
    private readonly orders: OrdersService,
    private readonly execution: OrderExecution,
  ) {}

  @Get('reservoirs/:id/orders')
  @Permission('orders.read')
  @ApiOkResponse({ description: 'Orders of the reservoir, newest first (Order[])' })
  list(@Param('id') id: string, @Query() q: OrderQueryDto): Promise<Order[]> {
    return this.orders.list(id, q);
  }

  @Post('reservoirs/:id/orders')
  @Permission('orders.draft')
  @ZodApiBody(
    createOrderRequestSchema,
    'steps (targets, minutes after execution), reason, planned start',
  )
  @ApiOkResponse({
    description: 'The new order, awaiting review, with its forecast and routed effect',
  })
  draft(
    @Param('id') id: string,
    @Body(new ZodBodyPipe(createOrderRequestSchema)) body: CreateOrderRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Order> {
    return this.orders.draft(id, body, p);
  }

  @Get('orders/:orderId')
  @Permission('orders.read')
  @ApiOkResponse({ description: 'One order with its commands (Order)' })
  get(@Param('orderId', orderId) id: number): Promise<Order> {
    return this.orders.get(id);
  }

  @Get('orders/:orderId/interlocks')
  @Permission('orders.read')
  @ApiOkResponse({
    description: 'The interlocks of the next step as they stand now (InterlockReport)',
  })
  interlocks(@Param('orderId', orderId) id: number): Promise<InterlockReport> {
    return this.execution.preview(id);
  }

  @Post('orders/:orderId/authorise')
  @HttpCode(200)
  @Permission('orders.authorise')
  @RequiresStepUp()
  @ZodApiBody(decisionRequestSchema)
  @ApiOkResponse({
    description: 'Authorised; runs out after ORDER_AUTHORISATION_TTL_MIN of site time',
  })
  authorise(
    @Param('orderId', orderId) id: number,
    @Body(new ZodBodyPipe(decisionRequestSchema)) body: DecisionRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Order> {
    return this.orders.review(id, 'authorised', body.comment, p);
  }

  @Post('orders/:orderId/decline')
  @HttpCode(200)
  @Permission('orders.authorise')
  @RequiresStepUp()
  @ZodApiBody(decisionRequestSchema)
  @ApiOkResponse({ description: 'Declined (final)' })
  decline(
    @Param('orderId', orderId) id: number,
    @Body(new ZodBodyPipe(decisionRequestSchema)) body: DecisionRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Order> {
    return this.orders.review(id, 'declined', body.comment, p);
  }

  @Post('orders/:orderId/withdraw')
  @HttpCode(200)
  @Permission('orders.draft')
  @ZodApiBody(withdrawRequestSchema)
  @ApiOkResponse({ description: 'Withdrawn before execution, or between steps (final)' })
  withdraw(
    @Param('orderId', orderId) id: number,
    @Body(new ZodBodyPipe(withdrawRequestSchema)) body: DecisionRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Order> {
    return this.orders.withdraw(id, body.comment, p);
  }

  @Post('orders/:orderId/execute')
  @HttpCode(200)
  @Permission('orders.execute')
  @ApiOkResponse({
    description: 'Interlocks passed, command sent (422 code interlock: the reasons)',
  })
  execute(@Param('orderId', orderId) id: number, @CurrentPrincipal() p: Principal): Promise<Order> {
    return this.execution.execute(id, p);
  }

  @Post('orders/:orderId/countersign')
  @HttpCode(200)
  @Permission('orders.countersign')
  @RequiresStepUp()
  @ZodApiBody(countersignRequestSchema)
  @ApiOkResponse({ description: 'An emergency action countersigned afterwards' })
  countersign(
    @Param('orderId', orderId) id: number,
    @Body(new ZodBodyPipe(countersignRequestSchema)) body: DecisionRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Order> {
    return this.orders.countersign(id, body.comment, p);
  }
}
