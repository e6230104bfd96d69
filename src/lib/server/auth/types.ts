/** The signed-in person as every route sees them on `event.locals.user`. */
export interface SessionUser {
	id: number;
	email: string;
	name: string;
	isAdmin: boolean;
}
