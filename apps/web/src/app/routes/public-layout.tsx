import { Outlet } from 'react-router-dom';
import { PublicFrame } from '../../components/layout/public-frame';

export function PublicLayout() {
  return (
    <PublicFrame>
      <Outlet />
    </PublicFrame>
  );
}
