// How a booking's status looks in both apps: our own colours (each pair above 4.5:1 contrast),
// always with words and an icon, so colour is never the only signal.
import type { Component } from 'vue';
import {
  CheckCircleOutlined,
  ClockCircleOutlined,
  CloseCircleOutlined,
  ExclamationCircleOutlined,
  HourglassOutlined,
  PlayCircleOutlined,
  StopOutlined,
  UserDeleteOutlined,
} from '@ant-design/icons-vue';
import type { BookingStatus } from '@emberline/domain';

export interface StatusLook {
  /** Text colour on `background`: dark enough for WCAG AA (4.5:1) at tag size. */
  color: string;
  background: string;
  border: string;
  icon: Component;
}

export const STATUS_LOOKS: Record<BookingStatus, StatusLook> = {
  held: { color: '#334155', background: '#f1f5f9', border: '#94a3b8', icon: HourglassOutlined },
  released: { color: '#475569', background: '#f8fafc', border: '#cbd5e1', icon: StopOutlined },
  requested: { color: '#7c2d12', background: '#ffedd5', border: '#ea580c', icon: ExclamationCircleOutlined },
  confirmed: { color: '#1e3a8a', background: '#dbeafe', border: '#3b82f6', icon: CheckCircleOutlined },
  in_progress: { color: '#4c1d95', background: '#ede9fe', border: '#8b5cf6', icon: PlayCircleOutlined },
  completed: { color: '#14532d', background: '#dcfce7', border: '#22c55e', icon: CheckCircleOutlined },
  declined: { color: '#7f1d1d', background: '#fee2e2', border: '#ef4444', icon: CloseCircleOutlined },
  expired: { color: '#475569', background: '#f1f5f9', border: '#94a3b8', icon: ClockCircleOutlined },
  cancelled_by_owner: { color: '#7f1d1d', background: '#fef2f2', border: '#fca5a5', icon: StopOutlined },
  cancelled_by_partner: { color: '#7f1d1d', background: '#fef2f2', border: '#fca5a5', icon: StopOutlined },
  no_show: { color: '#713f12', background: '#fef9c3', border: '#ca8a04', icon: UserDeleteOutlined },
};
