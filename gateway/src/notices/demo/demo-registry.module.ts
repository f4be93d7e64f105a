import { Module } from '@nestjs/common';
import { DemoRegistrySeeder } from './demo-registry';

/**
 * The demo seeder in a module of its own: the notices module is global, and global modules start
 * before the others, before the demo accounts exist; this one starts after them, so Hessford's
 * duty officer can be linked to the demo stakeholder account.
 */
@Module({ providers: [DemoRegistrySeeder] })
export class DemoRegistryModule {}
