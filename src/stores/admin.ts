// Administration: accounts and roles, the audit log, the local mail outbox.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { AuditEvent, MailMessage } from '../../shared/api/admin';
import type { CreateUserRequest, UpdateUserRequest, User } from '../../shared/api/users';
import { createAccount, listAccounts, listAudit, listMail, updateAccount, type AuditFilter } from '../api/admin';

/** What admins manage and inspect. */
export const useAdminStore = defineStore('admin', () => {
  /** Every account, sorted by name. */
  const users = ref<User[]>([]);
  /** Audit entries of the last query. */
  const audit = ref<AuditEvent[]>([]);
  /** The filter of the last audit query. */
  const auditFilter = ref<AuditFilter>({});
  /** Captured messages, newest first. */
  const mail = ref<MailMessage[]>([]);

  function sortUsers(rows: User[]): User[] {
    return [...rows].sort((x, y) => x.name.localeCompare(y.name));
  }

  /** Reloads the accounts. */
  async function loadUsers(): Promise<User[]> {
    users.value = sortUsers(await listAccounts());
    return users.value;
  }

  /** Creates an account. */
  async function createUser(request: CreateUserRequest): Promise<User> {
    const created = await createAccount(request);
    users.value = sortUsers([...users.value.filter((u) => u.id !== created.id), created]);
    return created;
  }

  /** Changes an account (role, name, disabled) and replaces it in the list. */
  async function updateUser(id: number, change: UpdateUserRequest): Promise<User> {
    const updated = await updateAccount(id, change);
    users.value = sortUsers(users.value.map((u) => (u.id === id ? updated : u)));
    return updated;
  }

  /** Queries the audit log. */
  async function loadAudit(filter: AuditFilter = {}): Promise<AuditEvent[]> {
    auditFilter.value = { ...filter };
    audit.value = await listAudit(filter);
    return audit.value;
  }

  /** Reloads the mail outbox. */
  async function loadMail(to?: string): Promise<MailMessage[]> {
    const rows = await listMail(to);
    mail.value = [...rows].sort((x, y) => y.receivedAt.localeCompare(x.receivedAt));
    return mail.value;
  }

  return { users, audit, auditFilter, mail, loadUsers, createUser, updateUser, loadAudit, loadMail };
});
