// Administration: accounts and roles, the audit log, the local mail outbox.
import { defineStore } from 'pinia';
import { ref } from 'vue';
import type { AuditEvent, MailMessage } from '../../shared/api/admin';
import { PAGE_SIZES, type PageRequest } from '../../shared/api/paging';
import type { CreateUserRequest, UpdateUserRequest, User } from '../../shared/api/users';
import { createAccount, listAccounts, listAudit, listMail, updateAccount, type AuditFilter } from '../api/admin';

/** What admins manage and inspect. */
export const useAdminStore = defineStore('admin', () => {
  /** Every account, sorted by name. */
  const users = ref<User[]>([]);
  /** Audit entries of the page last loaded. */
  const audit = ref<AuditEvent[]>([]);
  /** The filter of the last audit query. */
  const auditFilter = ref<AuditFilter>({});
  /** The page of `audit`. */
  const auditPage = ref<PageRequest>({ limit: PAGE_SIZES.audit.default, offset: 0 });
  /** Entries matching the filter, all pages together. */
  const auditTotal = ref(0);
  /** Captured messages of the page last loaded, newest first. */
  const mail = ref<MailMessage[]>([]);
  /** The page of `mail`. */
  const mailPage = ref<PageRequest>({ limit: PAGE_SIZES.mail.default, offset: 0 });
  /** Messages matching the recipient filter, all pages together. */
  const mailTotal = ref(0);

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

  /** Queries one page of the audit log (the first page unless given). */
  async function loadAudit(filter: AuditFilter = {}, page: PageRequest = { limit: auditPage.value.limit, offset: 0 }): Promise<AuditEvent[]> {
    const loaded = await listAudit(filter, page);
    auditFilter.value = { ...filter };
    auditPage.value = { ...page };
    auditTotal.value = loaded.total;
    audit.value = loaded.items;
    return audit.value;
  }

  /** Loads one page of the mail outbox (the first page unless given). */
  async function loadMail(to?: string, page: PageRequest = { limit: mailPage.value.limit, offset: 0 }): Promise<MailMessage[]> {
    const loaded = await listMail(to, page);
    mailPage.value = { ...page };
    mailTotal.value = loaded.total;
    mail.value = [...loaded.items].sort((x, y) => y.receivedAt.localeCompare(x.receivedAt));
    return mail.value;
  }

  return {
    users, audit, auditFilter, auditPage, auditTotal, mail, mailPage, mailTotal,
    loadUsers, createUser, updateUser, loadAudit, loadMail,
  };
});
