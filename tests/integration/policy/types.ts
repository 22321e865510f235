/** The least role a route needs. 'dev' routes exist only with the development mail catcher. */
export type Need = 'public' | 'user' | 'viewer' | 'editor' | 'owner' | 'dev';
