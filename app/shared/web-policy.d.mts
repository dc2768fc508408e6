export const ISOLATION_HEADERS: Readonly<Record<string, string>>;
export const CONTENT_SECURITY_POLICY: string;
