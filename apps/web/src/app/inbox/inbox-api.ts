import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import type { Inbox, NotificationPrefs, ReadAbout, SinkMessage, UpdateNotificationPrefs } from '@laminote/contracts';
import type { Observable } from 'rxjs';
import { API_BASE } from '../core/api-base';

/** The signed-in person's inbox, their notification preferences, and the development mail page. */
@Injectable({ providedIn: 'root' })
export class InboxApi {
  private readonly http = inject(HttpClient);
  private readonly base = inject(API_BASE);

  list(options: { unreadOnly: boolean }): Observable<Inbox> {
    return this.http.get<Inbox>(`${this.base}/inbox`, { params: options.unreadOnly ? { unread: 'true' } : {} });
  }

  unreadCount(): Observable<{ unreadCount: number }> {
    return this.http.get<{ unreadCount: number }>(`${this.base}/inbox/unread-count`);
  }

  markRead(notificationId: string): Observable<{ unreadCount: number }> {
    return this.http.post<{ unreadCount: number }>(`${this.base}/inbox/${encodeURIComponent(notificationId)}/read`, {});
  }

  /** Marks read the entries about a thread or a version the person has just opened. */
  markReadAbout(about: ReadAbout): Observable<{ unreadCount: number }> {
    return this.http.post<{ unreadCount: number }>(`${this.base}/inbox/read-about`, about);
  }

  markAllRead(): Observable<{ unreadCount: number }> {
    return this.http.post<{ unreadCount: number }>(`${this.base}/inbox/read-all`, {});
  }

  prefs(): Observable<NotificationPrefs> {
    return this.http.get<NotificationPrefs>(`${this.base}/me/notification-prefs`);
  }

  updatePrefs(change: UpdateNotificationPrefs): Observable<NotificationPrefs> {
    return this.http.put<NotificationPrefs>(`${this.base}/me/notification-prefs`, change);
  }

  /** Site admins, outside production: what the development mail sink received. */
  devMail(): Observable<SinkMessage[]> {
    return this.http.get<SinkMessage[]>(`${this.base}/dev/mail`);
  }
}
