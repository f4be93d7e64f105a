import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { MailModule } from '../mail/mail.module';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { AckLinks } from './ack-links';
import { AcknowledgementsController } from './acknowledgements.controller';
import { AcknowledgementsService } from './acknowledgements.service';
import { ClearanceService } from './clearance.service';
import { ContactRow } from './contact.entity';
import { DemoRegistryModule } from './demo/demo-registry.module';
import { DispatchService } from './dispatch.service';
import { EscalationService } from './escalation.service';
import { FeedController } from './feed/feed.controller';
import { FeedService } from './feed/feed.service';
import { NoticeRow } from './notice.entity';
import { NoticeBoardService } from './notice-board.service';
import { NoticesController } from './notices.controller';
import { NoticesService } from './notices.service';
import { OrderClearance } from './orders/order-clearance';
import { OrderNoticesModule } from './orders/order-notices.module';
import { RecipientRow } from './recipient.entity';
import { RegistryController } from './registry.controller';
import { RegistryService } from './registry.service';
import { ZoneRow } from './zone.entity';

/**
 * Downstream notices: the registry of zones and contacts, notices prepared from orders and sent by
 * mail, acknowledgements, escalation, the CAP feed, and the downstream interlock of gate orders.
 * Global so that the orders module can bind OrderClearance as its DOWNSTREAM_CLEARANCE without
 * importing this module (which follows the orders' events, so importing would be a cycle).
 */
@Global()
@Module({
  imports: [
    TypeOrmModule.forFeature([ZoneRow, ContactRow, NoticeRow, RecipientRow]),
    MailModule,
    ReservoirsModule,
    OrderNoticesModule,
    DemoRegistryModule,
  ],
  controllers: [RegistryController, NoticesController, AcknowledgementsController, FeedController],
  providers: [
    AckLinks,
    RegistryService,
    DispatchService,
    NoticeBoardService,
    NoticesService,
    EscalationService,
    AcknowledgementsService,
    ClearanceService,
    FeedService,
    OrderClearance,
  ],
  exports: [NoticesService, NoticeBoardService, ClearanceService, RegistryService, OrderClearance],
})
export class NoticesModule {}
