export { NdtScreen as default } from '@/features/pivot-life/ndt-screen';
