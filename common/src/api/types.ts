/**
 * Shapes that cross the wire between the screens and the API. Decimal values travel as strings
 * ("12.50"), dates as ISO-8601 strings. The server's DTO classes implement these interfaces.
 */
import type { AppRule } from '../permissions/abilities';
import type { Role } from '../roles';
import type { DiscountAuthority, SalesTaxTreatment } from '../branches/branch-rules';

export interface ApiErrorBody {
  /** Stable, machine-readable: AUTH.INVALID_CREDENTIALS, VALIDATION.FAILED, BRANCH.IN_USE … */
  code: string;
  message: string;
  /** For a validation failure: one entry per field at fault. */
  details: FieldError[] | Record<string, unknown> | null;
  requestId: string;
}

export interface FieldError {
  field: string;
  message: string;
}

export interface AuthUser {
  id: string;
  name: string;
  email: string;
  role: Role;
  branchIds: string[];
}

export interface LoginRequest {
  email: string;
  password: string;
}

export interface SessionResponse {
  accessToken: string;
  /** When the token stops working (ISO-8601). */
  expiresAt: string;
  user: AuthUser;
  rules: AppRule[];
}

export type MeResponse = Omit<SessionResponse, 'accessToken' | 'expiresAt'>;

export interface PasswordTokenInfo {
  email: string;
  name: string;
  purpose: 'invite' | 'reset';
  expiresAt: string;
}

export interface SetPasswordRequest {
  token: string;
  password: string;
}

export interface Branch {
  id: string;
  code: string;
  name: string;
  addressLine1: string;
  city: string;
  state: string;
  postalCode: string;
  phone: string | null;
  timezone: string;
  marginFloorPct: string;
  discountAuthority: DiscountAuthority;
  salesTaxTreatment: SalesTaxTreatment;
  salesTaxRatePct: string;
  userCount: number;
  inUse: boolean;
  createdAt: string;
  updatedAt: string;
}

export type BranchInput = Omit<Branch, 'id' | 'userCount' | 'inUse' | 'createdAt' | 'updatedAt'>;

export interface UserSummary {
  id: string;
  name: string;
  email: string;
  role: Role;
  active: boolean;
  branchIds: string[];
  /** True while the invitation has not been accepted (no password set yet). */
  invitationPending: boolean;
  lastSignInAt: string | null;
  createdAt: string;
}

export interface InviteUserRequest {
  name: string;
  email: string;
  role: Role;
  branchIds: string[];
}

export interface UpdateUserRequest {
  name?: string;
  role?: Role;
  branchIds?: string[];
  active?: boolean;
}

export interface HealthResponse {
  status: 'ok' | 'degraded';
  db: 'up' | 'down';
}

export interface Page<T> {
  items: T[];
  total: number;
}
