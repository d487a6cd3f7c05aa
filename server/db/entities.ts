import { ArtItem } from '../modules/art/art-item.entity';
import { ArtCollection } from '../modules/art/art-collection.entity';
import { Collection } from '../modules/collections/collection.entity';
import { Sheet } from '../modules/sheets/sheet.entity';
import { SheetProfile } from '../modules/sheets/sheet-profile.entity';
import { OutlineCacheEntry } from '../modules/outlines/outline-cache.entity';
import { Invite } from '../modules/teams/invite.entity';
import { Membership } from '../modules/accounts/membership.entity';
import { Team } from '../modules/accounts/team.entity';
import { PasswordReset } from '../modules/auth/password-reset.entity';
import { User } from '../modules/accounts/user.entity';
import { SheetExport } from '../modules/exports/sheet-export.entity';
import { Blade, Machine } from '../modules/shop/machine.entity';
import { PrintRun } from '../modules/shop/print-run.entity';
import { ShopSettingsRow } from '../modules/shop/shop-settings.entity';
import { StockItem } from '../modules/shop/stock-item.entity';
import { ArtKeyword, ArtTerm } from '../modules/art/art-index.entity';
import { SheetArt } from '../modules/sheets/sheet-art.entity';
import { Customer } from '../modules/orders/customer.entity';
import { Order, OrderEvent, OrderLine } from '../modules/orders/order.entity';
import { OrderProof } from '../modules/orders/proof.entity';
import { OrderPayment, PaymentNotice } from '../modules/orders/payment.entity';

export const entities = [
  User,
  Team,
  Membership,
  Invite,
  PasswordReset,
  ArtItem,
  ArtCollection,
  Collection,
  OutlineCacheEntry,
  SheetProfile,
  Sheet,
  StockItem,
  Machine,
  Blade,
  PrintRun,
  ShopSettingsRow,
  SheetExport,
  ArtKeyword,
  ArtTerm,
  SheetArt,
  Customer,
  Order,
  OrderLine,
  OrderEvent,
  OrderProof,
  OrderPayment,
  PaymentNotice,
];
