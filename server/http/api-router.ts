import express, { type RequestHandler } from 'express';
import type { Role } from '../auth/types';
import { forbidden, unauthorized } from '../lib/app-error';

// Every route declares who may call it. There is no way to add a route without an access policy,
// and the list of declared routes is kept so tests can enumerate them (deny by default).
export type Access = 'public' | 'signed-in' | readonly Role[];
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

export interface RouteSpec {
  method: Uppercase<Method>;
  path: string;
  access: Access;
}

export function requireAccess(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    if (!req.user) return next(unauthorized());
    if (access !== 'signed-in' && !access.includes(req.user.role)) return next(forbidden());
    next();
  };
}

export class ApiRouter {
  readonly router = express.Router();
  readonly routes: RouteSpec[] = [];

  private add(method: Method, path: string, access: Access, handlers: RequestHandler[]) {
    this.routes.push({ method: method.toUpperCase() as Uppercase<Method>, path, access });
    this.router[method](path, requireAccess(access), ...handlers);
    return this;
  }
  get = (path: string, access: Access, ...h: RequestHandler[]) => this.add('get', path, access, h);
  post = (path: string, access: Access, ...h: RequestHandler[]) => this.add('post', path, access, h);
  put = (path: string, access: Access, ...h: RequestHandler[]) => this.add('put', path, access, h);
  patch = (path: string, access: Access, ...h: RequestHandler[]) => this.add('patch', path, access, h);
  delete = (path: string, access: Access, ...h: RequestHandler[]) => this.add('delete', path, access, h);
}

export const STAFF: readonly Role[] = ['admin', 'organiser', 'director', 'technician'];
