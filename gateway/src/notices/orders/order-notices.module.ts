import { Module } from '@nestjs/common';
import { OrdersModule } from '../../orders/orders.module';
import { OrderNoticesListener } from './order-notices.listener';

/** The notices' side of gate orders: notices follow each order's drafting, ending and execution. */
@Module({
  imports: [OrdersModule],
  providers: [OrderNoticesListener],
  exports: [OrderNoticesListener],
})
export class OrderNoticesModule {}
