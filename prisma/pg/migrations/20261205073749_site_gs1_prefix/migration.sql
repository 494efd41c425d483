-- AlterTable
ALTER TABLE "Site" ADD COLUMN     "gs1CompanyPrefix" TEXT;
