// Emberline design tokens and the ant-design-vue theme built from them.
import type { ThemeConfig } from 'ant-design-vue/es/config-provider/context';

/** Raw colour tokens: ember orange on slate. Primary passes WCAG AA with white text. */
export const colors = {
  ember: '#c2410c',
  emberHover: '#9a3412',
  emberActive: '#7c2d12',
  emberSoft: '#fff4ed',
  emberGlow: '#fdba74',
  emberBright: '#ea580c',
  slate900: '#0f172a',
  slate800: '#1e293b',
  slate700: '#334155',
  slate500: '#64748b',
  slate200: '#e2e8f0',
  slate50: '#f8fafc',
  white: '#ffffff',
  success: '#15803d',
  warning: '#b45309',
  danger: '#b91c1c',
} as const;

export const fontFamily =
  "'Lato', system-ui, -apple-system, 'Segoe UI', 'Helvetica Neue', Arial, sans-serif";

export const radii = { small: 6, base: 10, large: 16 } as const;

export const space = { xs: 4, sm: 8, md: 16, lg: 24, xl: 40, xxl: 64 } as const;

export const emberlineTheme: ThemeConfig = {
  token: {
    colorPrimary: colors.ember,
    colorPrimaryHover: colors.emberHover,
    colorPrimaryActive: colors.emberActive,
    colorLink: colors.ember,
    colorLinkHover: colors.emberHover,
    colorLinkActive: colors.emberActive,
    colorSuccess: colors.success,
    colorWarning: colors.warning,
    colorError: colors.danger,
    colorInfo: colors.slate700,
    colorInfoBg: '#f1f5f9',
    colorInfoBorder: '#cbd5e1',
    colorSuccessBg: '#f0fdf4',
    colorSuccessBorder: '#bbf7d0',
    colorWarningBg: '#fffbeb',
    colorWarningBorder: '#fde68a',
    colorErrorBg: '#fef2f2',
    colorErrorBorder: '#fecaca',
    colorText: colors.slate900,
    colorTextSecondary: colors.slate700,
    colorTextTertiary: colors.slate500,
    colorBorder: '#cbd5e1',
    colorBorderSecondary: colors.slate200,
    colorBgLayout: colors.slate50,
    colorBgContainer: colors.white,
    fontFamily,
    fontSize: 15,
    borderRadius: radii.base,
    borderRadiusSM: radii.small,
    borderRadiusLG: radii.large,
    controlHeight: 40,
    wireframe: false,
  },
  components: {
    Layout: {
      colorBgHeader: colors.slate900,
      colorBgBody: colors.slate50,
      colorBgTrigger: colors.slate800,
    },
    Menu: {
      colorItemBgSelected: colors.emberSoft,
      colorItemTextSelected: colors.ember,
    },
    Table: {
      colorFillAlter: colors.slate50,
    },
  },
};
