// Purchasing: suppliers, which supplier each price-list item comes from, and purchase orders
// made from a job's materials list (one per supplier), sent as a PDF, and received.
import {
	date,
	doublePrecision,
	index,
	integer,
	pgTable,
	text,
	uniqueIndex
} from 'drizzle-orm/pg-core';
import { byUser } from './auth';
import { jobMaterials, ofJob } from './jobs';
import { at, createdAt, updatedAt } from './columns';

export const suppliers = pgTable('suppliers', {
	id: text('id').primaryKey(),
	name: text('name').notNull().unique(),
	email: text('email').notNull(),
	phone: text('phone').notNull().default(''),
	createdAt: createdAt(),
	updatedAt: updatedAt()
});

/** The supplier a price-list item or pump ('pump:<id>', as materials lists name pumps) comes from. */
export const itemSuppliers = pgTable('item_suppliers', {
	sku: text('sku').primaryKey(),
	supplierId: text('supplier_id')
		.notNull()
		.references(() => suppliers.id, { onDelete: 'cascade' }),
	createdAt: createdAt()
});

export const purchaseOrders = pgTable(
	'purchase_orders',
	{
		id: text('id').primaryKey(),
		/** PO-1001 … */
		number: integer('number').generatedAlwaysAsIdentity({ startWith: 1001 }).notNull().unique(),
		jobId: ofJob(),
		supplierId: text('supplier_id')
			.notNull()
			.references(() => suppliers.id),
		status: text('status', { enum: ['draft', 'sent', 'received'] })
			.notNull()
			.default('draft'),
		expectedOn: date('expected_on'),
		deliveryNote: text('delivery_note').notNull().default(''),
		totalCents: integer('total_cents').notNull().default(0),
		sentAt: at('sent_at'),
		receivedAt: at('received_at'),
		createdBy: byUser('created_by'),
		createdAt: createdAt(),
		updatedAt: updatedAt()
	},
	(t) => [index('purchase_orders_job_idx').on(t.jobId)]
);

export const purchaseOrderLines = pgTable(
	'purchase_order_lines',
	{
		id: text('id').primaryKey(),
		purchaseOrderId: text('purchase_order_id')
			.notNull()
			.references(() => purchaseOrders.id, { onDelete: 'cascade' }),
		/** The job's material line it orders (one order line per material line). */
		materialId: text('material_id')
			.notNull()
			.references(() => jobMaterials.id, { onDelete: 'cascade' }),
		sku: text('sku').notNull(),
		description: text('description').notNull(),
		unit: text('unit').notNull(),
		quantity: doublePrecision('quantity').notNull(),
		unitCostCents: integer('unit_cost_cents').notNull(),
		extendedCents: integer('extended_cents').notNull(),
		receivedQuantity: doublePrecision('received_quantity'),
		receivedCostCents: integer('received_cost_cents'),
		createdAt: createdAt()
	},
	(t) => [uniqueIndex('purchase_order_lines_material_idx').on(t.materialId)]
);

export type Supplier = typeof suppliers.$inferSelect;
export type PurchaseOrder = typeof purchaseOrders.$inferSelect;
export type PurchaseOrderLine = typeof purchaseOrderLines.$inferSelect;
