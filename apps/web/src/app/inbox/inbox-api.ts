import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Inbox, NotificationPrefs, ReadAbout, SinkMessage, UnreadCount, UpdateNotificationPrefs } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';
import { checked } from '../core/checked';

/** The signed-in person's inbox, their notification preferences, and the development mail page. */
@Injectable({ providedIn: 'root' })
export class InboxApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  list(options: { unreadOnly: boolean }): Observable<Inbox> {
    return this.http.get(`${this.base}/inbox`, { params: options.unreadOnly ? { unread: 'true' } : {} }).pipe(checked('inbox', 'the inbox'));
  }

  unreadCount(): Observable<UnreadCount> {
    return this.http.get(`${this.base}/inbox/unread-count`).pipe(checked('unreadCount', 'the unread count'));
  }

  markRead(notificationId: string): Observable<UnreadCount> {
    return this.http.post(`${this.base}/inbox/${encodeURIComponent(notificationId)}/read`, {}).pipe(checked('unreadCount', 'the unread count'));
  }

  /** Marks read the entries about a thread or a version the person has just opened. */
  markReadAbout(about: ReadAbout): Observable<UnreadCount> {
    return this.http.post(`${this.base}/inbox/read-about`, about).pipe(checked('unreadCount', 'the unread count'));
  }

  markAllRead(): Observable<UnreadCount> {
    return this.http.post(`${this.base}/inbox/read-all`, {}).pipe(checked('unreadCount', 'the unread count'));
  }

  prefs(): Observable<NotificationPrefs> {
    return this.http.get(`${this.base}/me/notification-prefs`).pipe(checked('notificationPrefs', 'the notification settings'));
  }

  updatePrefs(change: UpdateNotificationPrefs): Observable<NotificationPrefs> {
    return this.http.put(`${this.base}/me/notification-prefs`, change).pipe(checked('notificationPrefs', 'the saved notification settings'));
  }

  /** Site admins, outside production: what the development mail sink received. */
  devMail(): Observable<SinkMessage[]> {
    return this.http.get<SinkMessage[]>(`${this.base}/dev/mail`);
  }
}
